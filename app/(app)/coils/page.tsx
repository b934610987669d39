import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { hasRole } from "@/lib/auth/roles";
import { listCoils } from "@/lib/db/coils";
import { coilListQuerySchema, type SearchParams } from "@/lib/validation/list-query";
import { formatDate, formatQuantity } from "@/lib/units/format";
import { Pagination } from "@/app/ui/pagination";
import { FilterForm } from "@/app/ui/list-filters";
import { COIL_STATUS_LABEL, TOPOLOGY_LABEL } from "@/app/ui/labels";

export const metadata: Metadata = { title: "Coils" };

export default async function CoilsPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser();
  const query = coilListQuerySchema.parse(await searchParams);
  const result = await listCoils(user.scope, { q: query.q, status: query.status, sort: query.sort }, { page: query.page });
  return (
    <>
      <div className="page-head">
        <h1>Coils</h1>
        <div className="inline-form no-print">
          {hasRole(user.role, "steward") && (
            <>
              <Link href="/coils/new" className="button">
                New coil
              </Link>
              <Link href="/coils/import">Import</Link>
            </>
          )}
          <Link href="/coils/plan">Plan a build</Link>
          <a href="/api/export/fleet.json">Fleet JSON</a>
          <a href="/api/export/fleet.csv">Fleet summary CSV</a>
        </div>
      </div>
      <FilterForm label="Filter coils">
        <div className="field">
          <label htmlFor="q">Search</label>
          <input id="q" name="q" defaultValue={query.q ?? ""} placeholder="Tag, name or builder" />
        </div>
        <div className="field">
          <label htmlFor="status">Status</label>
          <select id="status" name="status" defaultValue={query.status ?? ""}>
            <option value="">Any</option>
            <option value="planned">Planned</option>
            <option value="active">Active</option>
            <option value="repair">In repair</option>
            <option value="retired">Retired</option>
          </select>
        </div>
        <div className="field">
          <label htmlFor="sort">Sort by</label>
          <select id="sort" name="sort" defaultValue={query.sort}>
            <option value="tag">Tag</option>
            <option value="name">Name</option>
            <option value="updated">Recently changed</option>
          </select>
        </div>
      </FilterForm>
      <div className="table-wrap">
        <table>
          <caption>{result.total} coil{result.total === 1 ? "" : "s"}</caption>
          <thead>
            <tr>
              <th scope="col">Tag</th>
              <th scope="col">Name</th>
              <th scope="col">Status</th>
              <th scope="col">Driver</th>
              <th scope="col" className="num">Form Ø</th>
              <th scope="col" className="num">Turns</th>
              <th scope="col" className="num">Sessions</th>
              <th scope="col" className="num">Sweeps</th>
              <th scope="col" className="num">Failures</th>
              <th scope="col">Changed</th>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((coil) => (
              <tr key={coil.id}>
                <td>
                  <Link href={`/coils/${encodeURIComponent(coil.tag)}`}>{coil.tag}</Link>
                </td>
                <td>{coil.name}</td>
                <td>
                  <span className={`badge badge-${coil.status}`}>{COIL_STATUS_LABEL[coil.status]}</span>
                </td>
                <td>{TOPOLOGY_LABEL[coil.topology]}</td>
                <td className="num">{formatQuantity(coil.formDiameterM, "m")}</td>
                <td className="num">{coil.turns}</td>
                <td className="num">{coil._count.sessions}</td>
                <td className="num">{coil._count.sweeps}</td>
                <td className="num">{coil._count.failures}</td>
                <td>{formatDate(coil.updatedAt)}</td>
              </tr>
            ))}
            {result.rows.length === 0 && (
              <tr>
                <td colSpan={10}>No coils match these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Pagination basePath="/coils" params={{ q: query.q, status: query.status, sort: query.sort }} page={result.page} pageCount={result.pageCount} total={result.total} />
    </>
  );
}
