/** `npm run bench`: every benchmark, one after another. */
import { benchCalc } from "./calc";

async function main(): Promise<void> {
  await benchCalc();
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
