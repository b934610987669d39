import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listSweeps } from "@/lib/db/sweeps";
import { listCoilChoices } from "@/lib/db/coils";
import { sweepListQuerySchema, type SearchParams } from "@/lib/validation/list-query";
import { formatDateTime, formatQuantity } from "@/lib/units/format";
import { Pagination } from "@/app/ui/pagination";
import { FilterForm, CoilFilter } from "@/app/ui/list-filters";

export const metadata: Metadata = { title: "Sweeps" };

export default async function SweepsPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser();
  const query = sweepListQuerySchema.parse(await searchParams);
  const [result, coils] = await Promise.all([listSweeps(user.scope, { coilTag: query.coil, q: query.q, sort: query.sort }, { page: query.page }), listCoilChoices(user.scope)]);
  return (
    <>
      <div className="page-head">
        <h1>Resonance sweeps</h1>
        <p className="inline-form no-print">
          <Link className="button" href={query.coil ? `/sweeps/new?coil=${encodeURIComponent(query.coil)}` : "/sweeps/new"}>
            New sweep
          </Link>
          <Link className="button secondary" href={query.coil ? `/sweeps/import?coil=${encodeURIComponent(query.coil)}` : "/sweeps/import"}>
            Import CSV
          </Link>
        </p>
      </div>
      <FilterForm label="Filter sweeps">
        <div className="field">
          <label htmlFor="q">Search</label>
          <input id="q" name="q" type="search" defaultValue={query.q ?? ""} placeholder="Coil, top load or notes" />
        </div>
        <CoilFilter coils={coils} value={query.coil} />
        <div className="field">
          <label htmlFor="sort">Sort by</label>
          <select id="sort" name="sort" defaultValue={query.sort}>
            <option value="newest">Newest first</option>
            <option value="oldest">Oldest first</option>
            <option value="frequency">First resonance</option>
          </select>
        </div>
      </FilterForm>
      <div className="table-wrap">
        <table>
          <caption>{result.total} sweep{result.total === 1 ? "" : "s"}</caption>
          <thead>
            <tr>
              <th scope="col">Taken</th>
              <th scope="col">Coil</th>
              <th scope="col">Top load</th>
              <th scope="col" className="num">Series R</th>
              <th scope="col" className="num">Points</th>
              <th scope="col" className="num">First series resonance</th>
              <th scope="col">By</th>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((s) => (
              <tr key={s.id}>
                <td>
                  <Link href={`/sweeps/${encodeURIComponent(s.id)}`}>{formatDateTime(s.takenAt)}</Link>
                </td>
                <td>
                  <Link href={`/coils/${encodeURIComponent(s.coil.tag)}`}>{s.coil.tag}</Link>
                </td>
                <td>{s.topLoad?.name ?? "—"}</td>
                <td className="num">{formatQuantity(s.seriesResistanceOhm, "Ω")}</td>
                <td className="num">{s.pointCount}</td>
                <td className="num">{formatQuantity(s.firstSeriesResonanceHz, "Hz")}</td>
                <td>{s.takenBy?.name ?? "—"}</td>
              </tr>
            ))}
            {result.rows.length === 0 && (
              <tr>
                <td colSpan={7}>No sweeps match these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Pagination basePath="/sweeps" params={{ q: query.q, coil: query.coil, sort: query.sort }} page={result.page} pageCount={result.pageCount} total={result.total} />
    </>
  );
}
