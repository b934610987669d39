/**
 * Copy the whole database into another, empty, migrated one and prove the copy (lib/db/copy-database.ts).
 *   npm run db:copy -- --to postgresql://coilyard@db.example.org:5432/coilyard   # from DATABASE_URL (default: the SQLite file); password in PGPASSWORD
 *   npm run db:copy -- --from file:./data/coilyard.db --to postgresql://…
 * Stop the app first: rows written to the source during the copy would make the check fail (and nothing is kept).
 */
import { parseArgs } from "node:util";
import { copyDatabaseByUrl, CopyRefusedError } from "../lib/db/copy-database";
import { databaseProvider, databaseUrl } from "../lib/config/database-url";

const { values } = parseArgs({ options: { from: { type: "string" }, to: { type: "string" } } });
const from = databaseUrl({ ...process.env, DATABASE_URL: values.from ?? process.env.DATABASE_URL });
if (!values.to) {
  console.error("Name the target: npm run db:copy -- --to postgresql://role@host:5432/database (password in PGPASSWORD or the URL; migrate it first: DATABASE_URL=… npm run setup)");
  process.exit(2);
}
const to = databaseUrl({ ...process.env, DATABASE_URL: values.to });
const hidePassword = (url: string) => url.replace(/\/\/([^:/@]+):[^@/]*@/, "//$1:…@");
if (from === to) {
  console.error("The source and the target are the same database.");
  process.exit(2);
}

const started = Date.now();
try {
  console.log(`Copying ${hidePassword(from)} (${databaseProvider(from)}) → ${hidePassword(to)} (${databaseProvider(to)})`);
  const report = await copyDatabaseByUrl(from, to, (model, rows) => console.log(`  ${model.padEnd(16)} ${String(rows).padStart(10)} rows copied`));
  console.log(`Verified: every table has the same rows in both databases (${report.totalRows} rows, counts and digests match).`);
  console.log(`Done in ${((Date.now() - started) / 1000).toFixed(1)} s. Point DATABASE_URL at the new database and start the app.`);
} catch (error) {
  if (error instanceof CopyRefusedError) {
    console.error(`Not copied: ${error.message}`);
    process.exitCode = 1;
  } else throw error;
}
