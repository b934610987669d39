/**
 * Create the first admin of a real deployment (no demo data):
 *   npm run create-admin -- --email you@example.org --name "Your Name" [--site <short name>]
 * The account is an organisation admin (admin at every site, manages sites), listed among the members of the default
 * site, or of --site. The password is read from COILYARD_ADMIN_PASSWORD or asked for on the terminal.
 */
import { createInterface } from "node:readline/promises";
import { parseArgs } from "node:util";
import { hashPassword } from "../lib/auth/password";
import { createOrganisationAdmin, DuplicateEmailError } from "../lib/db/users";
import { findSiteBySlug } from "../lib/db/sites";
import { DEFAULT_SITE_ID } from "../lib/db/site-scope";
import { newUserSchema } from "../lib/validation/user";

async function main() {
  const { values } = parseArgs({ options: { email: { type: "string" }, name: { type: "string" }, site: { type: "string" } } });
  let password = process.env.COILYARD_ADMIN_PASSWORD;
  if (!password) {
    const rl = createInterface({ input: process.stdin, output: process.stdout });
    password = await rl.question("Password for the new admin (at least 10 characters): ");
    rl.close();
  }
  const parsed = newUserSchema.safeParse({ email: values.email, name: values.name, role: "admin", password });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) console.error(`${issue.path.join(".") || "input"}: ${issue.message}`);
    console.error('Usage: npm run create-admin -- --email you@example.org --name "Your Name"');
    process.exit(2);
  }
  const site = values.site === undefined ? { id: DEFAULT_SITE_ID } : await findSiteBySlug(values.site);
  if (!site) {
    console.error(`No site has the short name "${values.site}".`);
    process.exit(2);
  }
  try {
    const { email, name } = parsed.data;
    const user = await createOrganisationAdmin(null, { email, name, siteId: site.id, passwordHash: await hashPassword(parsed.data.password) });
    console.log(`Created organisation admin ${user.name} <${user.email}>. Sign in at /sign-in.`);
  } catch (error) {
    if (error instanceof DuplicateEmailError) {
      console.error(error.message);
      process.exit(1);
    }
    throw error;
  }
}

await main();
