import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listUsers } from "@/lib/db/users";
import { listAuditEvents } from "@/lib/db/audit";
import { formatDateTime } from "@/lib/units/format";
import { AddUserForm } from "./add-user-form";
import { AccessForm } from "./access-form";

export const metadata: Metadata = { title: "Admin" };

export default async function AdminPage() {
  await pageUser("admin");
  const [users, events] = await Promise.all([listUsers(), listAuditEvents({ take: 30 })]);
  return (
    <>
      <h1>Admin</h1>
      <p>
        <Link href="/admin/policy">Lending policy and its versions</Link>
      </p>
      <section aria-labelledby="users-heading">
        <h2 id="users-heading">Users</h2>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">E-mail</th>
                <th scope="col">Last sign-in</th>
                <th scope="col">Role and state</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => (
                <tr key={u.id}>
                  <td>{u.name}</td>
                  <td>{u.email}</td>
                  <td>{formatDateTime(u.lastSignInAt)}</td>
                  <td>
                    <AccessForm userId={u.id} name={u.name} role={u.role} active={u.active} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
      <AddUserForm />
      <section aria-labelledby="audit-heading">
        <h2 id="audit-heading">Recent changes</h2>
        <div className="table-wrap">
          <table>
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
                  <td>{formatDateTime(e.at)}</td>
                  <td>{e.actor?.name ?? "system"}</td>
                  <td>
                    {e.entity}: {e.summary}
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
