import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listSiteMembers } from "@/lib/db/users";
import { listAuditEntities, listAuditEvents } from "@/lib/db/audit";
import { formatDateTime, formatQuantitiesInText } from "@/lib/units/format";
import { auditQuerySchema, type SearchParams } from "@/lib/validation/list-query";
import { FilterForm } from "@/app/ui/list-filters";
import { COIL_TAG_EXAMPLE } from "@/lib/validation/coil";
import { AddUserForm } from "./add-user-form";
import { AddMemberForm } from "./add-member-form";
import { AccessForm, RemoveMemberForm } from "./access-form";

export const metadata: Metadata = { title: "Admin" };

/** A day typed in the filter, as the instant it starts or ends in the server's time zone (the one dates are shown in). */
const dayStart = (day: string | undefined) => (day ? new Date(`${day}T00:00:00`) : undefined);
const dayEnd = (day: string | undefined) => (day ? new Date(`${day}T23:59:59.999`) : undefined);

/** The current site's members and audit trail: what an admin of the site manages (an organisation admin, any site's). */
export default async function AdminPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser("admin");
  const query = auditQuerySchema.parse(await searchParams);
  const filtered = Boolean(query.who || query.entity || query.q || query.from || query.to);
  const [users, entities, events] = await Promise.all([
    listSiteMembers(user.scope),
    listAuditEntities(user.scope),
    listAuditEvents(user.scope, { actorId: query.who, entity: query.entity, q: query.q, from: dayStart(query.from), to: dayEnd(query.to), take: filtered ? 200 : 30 }),
  ]);
  const site = user.site.name;
  return (
    <>
      <h1>Admin: {site}</h1>
      <p>
        <Link href="/admin/policy">Lending policy and its versions</Link>
        {user.organisationAdmin && (
          <>
            {" · "}
            <Link href="/admin/sites">Sites and organisation admins</Link>
          </>
        )}
      </p>
      <section aria-labelledby="users-heading">
        <h2 id="users-heading">Members of {site}</h2>
        <p className="hint">
          Roles are per site: someone may be a steward here and a member elsewhere. Removing a member from {site} leaves their account and other sites as
          they are.
        </p>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">E-mail</th>
                <th scope="col">Last sign-in</th>
                <th scope="col">Role here and state</th>
                <th scope="col">Membership</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => (
                <tr key={u.id}>
                  <td>
                    {u.name}
                    {u.organisationAdmin && <> <span className="badge badge-neutral">organisation admin</span></>}
                  </td>
                  <td>{u.email}</td>
                  <td>{formatDateTime(u.lastSignInAt)}</td>
                  <td>
                    <AccessForm userId={u.id} name={u.name} role={u.role} active={u.active} siteName={site} canChangeActive={user.organisationAdmin || u.otherSites === 0} />
                  </td>
                  <td>
                    <RemoveMemberForm userId={u.id} name={u.name} siteName={site} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
      <AddMemberForm siteName={site} />
      <AddUserForm siteName={site} />
      <section aria-labelledby="audit-heading">
        <h2 id="audit-heading">Recent changes at {site}</h2>
        <FilterForm label="Filter the audit log">
          <div className="field">
            <label htmlFor="audit-who">Who</label>
            <select id="audit-who" name="who" defaultValue={query.who ?? ""}>
              <option value="">Anyone</option>
              <option value="system">System (no user)</option>
              {users.map((u) => (
                <option key={u.id} value={u.id}>
                  {u.name}
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="audit-entity">Record</label>
            <select id="audit-entity" name="entity" defaultValue={query.entity ?? ""}>
              <option value="">Any</option>
              {entities.map((e) => (
                <option key={e} value={e}>
                  {e}
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="audit-q">What (words)</label>
            <input id="audit-q" name="q" type="search" defaultValue={query.q ?? ""} placeholder={`e.g. ${COIL_TAG_EXAMPLE} or replaced`} />
          </div>
          <div className="field">
            <label htmlFor="audit-from">From</label>
            <input id="audit-from" name="from" type="date" defaultValue={query.from ?? ""} />
          </div>
          <div className="field">
            <label htmlFor="audit-to">To</label>
            <input id="audit-to" name="to" type="date" defaultValue={query.to ?? ""} />
          </div>
        </FilterForm>
        <div className="table-wrap">
          <table>
            <caption>
              {events.length} change{events.length === 1 ? "" : "s"}
              {filtered ? " matching the filters" : ", newest first"}
            </caption>
            <thead>
              <tr>
                <th scope="col">When</th>
                <th scope="col">Who</th>
                <th scope="col">What</th>
              </tr>
            </thead>
            <tbody>
              {events.map((e) => (
                <tr key={e.id}>
                  <td className="nowrap">{formatDateTime(e.at)}</td>
                  <td>{e.actor?.name ?? "system"}</td>
                  <td>
                    {e.entity}: {formatQuantitiesInText(e.summary)}
                  </td>
                </tr>
              ))}
              {events.length === 0 && (
                <tr>
                  <td colSpan={3}>No change matches these filters.</td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
      </section>
    </>
  );
}
