import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listFailures } from "@/lib/db/failures";
import { failureListQuerySchema, type SearchParams } from "@/lib/validation/list-query";
import { formatDate } from "@/lib/units/format";
import { Pagination } from "@/app/ui/pagination";
import { FilterForm } from "@/app/ui/list-filters";
import { FAILURE_MODE_LABEL } from "@/app/ui/labels";

export const metadata: Metadata = { title: "Failures" };

export default async function FailuresPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser();
  const query = failureListQuerySchema.parse(await searchParams);
  const result = await listFailures(user.scope, { q: query.q, status: query.status, mode: query.mode }, { page: query.page });
  return (
    <>
      <div className="page-head">
        <h1>Failures and post-mortems</h1>
        <Link className="button" href="/failures/new">
          Record a failure
        </Link>
      </div>
      <FilterForm label="Filter failures">
        <div className="field">
          <label htmlFor="q">Search</label>
          <input id="q" name="q" defaultValue={query.q ?? ""} placeholder="Coil tag, symptom or cause" />
        </div>
        <div className="field">
          <label htmlFor="status">Post-mortem</label>
          <select id="status" name="status" defaultValue={query.status ?? ""}>
            <option value="">Any</option>
            <option value="open">Open</option>
            <option value="closed">Completed</option>
          </select>
        </div>
        <div className="field">
          <label htmlFor="mode">Failure mode</label>
          <select id="mode" name="mode" defaultValue={query.mode ?? ""}>
            <option value="">Any</option>
            {Object.entries(FAILURE_MODE_LABEL).map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </div>
      </FilterForm>
      <div className="table-wrap">
        <table>
          <caption>{result.total} failure{result.total === 1 ? "" : "s"}</caption>
          <thead>
            <tr>
              <th scope="col">Date</th>
              <th scope="col">Coil</th>
              <th scope="col">Part</th>
              <th scope="col">Mode</th>
              <th scope="col">Symptoms</th>
              <th scope="col">Post-mortem</th>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((f) => (
              <tr key={f.id}>
                <td>
                  <Link href={`/failures/${f.id}`}>{formatDate(f.occurredAt)}</Link>
                </td>
                <td>
                  <Link href={`/coils/${encodeURIComponent(f.coil.tag)}`}>{f.coil.tag}</Link>
                </td>
                <td>{f.component?.partNumber ?? "—"}</td>
                <td>{FAILURE_MODE_LABEL[f.mode]}</td>
                <td>{f.symptoms}</td>
                <td>
                  <Link href={`/failures/${f.id}`} aria-label={`Post-mortem of the ${f.coil.tag} failure on ${formatDate(f.occurredAt)}: ${f.status === "open" ? "open" : "completed"}`}>
                    <span className={`badge badge-${f.status}`}>{f.status === "open" ? "Open" : "Completed"}</span>
                  </Link>
                </td>
              </tr>
            ))}
            {result.rows.length === 0 && (
              <tr>
                <td colSpan={6}>No failures match these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Pagination basePath="/failures" params={{ q: query.q, status: query.status, mode: query.mode }} page={result.page} pageCount={result.pageCount} total={result.total} />
    </>
  );
}
