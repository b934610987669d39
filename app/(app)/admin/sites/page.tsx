import type { Metadata } from "next";
import Link from "next/link";
import { forbidden } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { listSites } from "@/lib/db/sites";
import { listAllUsers } from "@/lib/db/users";
import { AddSiteForm, OrganisationAdminForm, RenameSiteForm } from "./site-forms";

export const metadata: Metadata = { title: "Sites" };

/** The organisation admin's page: every site, and every account with the sites it belongs to. */
export default async function SitesPage() {
  const user = await pageUser("admin");
  if (!user.organisationAdmin) forbidden();
  const [sites, accounts] = await Promise.all([listSites(user.scope), listAllUsers(user.scope)]);
  return (
    <>
      <h1>Sites and organisation admins</h1>
      <p className="lede">
        Each site keeps its own coils, logbooks, members and lending policy. An organisation admin is an admin at every site. To manage a site&apos;s members,
        switch to it and open <Link href="/admin">Admin</Link>; <Link href="/district">District</Link> shows every site&apos;s fleet at a glance.
      </p>
      <section aria-labelledby="sites-heading">
        <h2 id="sites-heading">Sites</h2>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Site</th>
                <th scope="col">Members</th>
                <th scope="col">Coils</th>
                <th scope="col">Name and short name</th>
              </tr>
            </thead>
            <tbody>
              {sites.map((site) => (
                <tr key={site.id}>
                  <td>{site.name}</td>
                  <td>{site.members}</td>
                  <td>{site.coils}</td>
                  <td>
                    <RenameSiteForm siteId={site.id} name={site.name} slug={site.slug} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
      <AddSiteForm />
      <section aria-labelledby="accounts-heading">
        <h2 id="accounts-heading">Every account</h2>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">E-mail</th>
                <th scope="col">Sites and roles</th>
                <th scope="col">Organisation admin</th>
              </tr>
            </thead>
            <tbody>
              {accounts.map((account) => (
                <tr key={account.id}>
                  <td>
                    {account.name}
                    {!account.active && <> <span className="badge badge-neutral">deactivated</span></>}
                  </td>
                  <td>{account.email}</td>
                  <td>{account.memberships.length === 0 ? "none" : account.memberships.map((m) => `${m.site.name}: ${m.role}`).join("; ")}</td>
                  <td>
                    <OrganisationAdminForm userId={account.id} name={account.name} organisationAdmin={account.organisationAdmin} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </>
  );
}
