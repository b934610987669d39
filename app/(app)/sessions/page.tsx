import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { listSessions } from "@/lib/db/sessions";
import { listCoilChoices } from "@/lib/db/coils";
import { sessionListQuerySchema, type SearchParams } from "@/lib/validation/list-query";
import { formatDateTime, formatDuration, formatNumber, formatQuantity, formatTemperature } from "@/lib/units/format";
import { Pagination } from "@/app/ui/pagination";
import { FilterForm, CoilFilter } from "@/app/ui/list-filters";
import { OUTCOME_LABEL } from "@/app/ui/labels";

export const metadata: Metadata = { title: "Run sessions" };

export default async function SessionsPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser();
  const query = sessionListQuerySchema.parse(await searchParams);
  const [result, coils] = await Promise.all([
    listSessions(user.scope, { coilTag: query.coil, outcome: query.outcome, sort: query.sort, q: query.q }, { page: query.page }),
    listCoilChoices(user.scope),
  ]);
  return (
    <>
      <div className="page-head">
        <h1>Run sessions</h1>
        <Link className="button big-button" href={query.coil ? `/sessions/new?coil=${encodeURIComponent(query.coil)}` : "/sessions/new"}>
          Log a session
        </Link>
      </div>
      <FilterForm label="Filter sessions">
        <CoilFilter coils={coils} value={query.coil} />
        <div className="field">
          <label htmlFor="outcome">Outcome</label>
          <select id="outcome" name="outcome" defaultValue={query.outcome ?? ""}>
            <option value="">Any</option>
            {Object.entries(OUTCOME_LABEL).map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor="q">Search</label>
          <input id="q" name="q" type="search" defaultValue={query.q ?? ""} placeholder="Coil or notes" />
        </div>
        <div className="field">
          <label htmlFor="sort">Sort by</label>
          <select id="sort" name="sort" defaultValue={query.sort}>
            <option value="newest">Newest first</option>
            <option value="oldest">Oldest first</option>
            <option value="voltage">Supply voltage</option>
            <option value="current">Supply current</option>
            <option value="duration">Duration</option>
          </select>
        </div>
      </FilterForm>
      <div className="table-wrap">
        <table>
          <caption>{result.total} session{result.total === 1 ? "" : "s"}</caption>
          <thead>
            <tr>
              <th scope="col">Started</th>
              <th scope="col">Coil</th>
              <th scope="col" className="num">Supply</th>
              <th scope="col" className="num">Current</th>
              <th scope="col" className="num">Duration</th>
              <th scope="col" className="num">Sink end</th>
              <th scope="col" className="num">Running f</th>
              <th scope="col">Outcome</th>
              <th scope="col">Logged by</th>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((s) => (
              <tr key={s.id}>
                <td>
                  <Link href={`/sessions/${s.id}`}>{formatDateTime(s.startedAt)}</Link>
                </td>
                <td>
                  <Link href={`/coils/${encodeURIComponent(s.coil.tag)}`}>{s.coil.tag}</Link>
                </td>
                <td className="num">{formatNumber(s.supplyVoltageV, 1, "V")}</td>
                <td className="num">{formatNumber(s.supplyCurrentA, 2, "A")}</td>
                <td className="num">{formatDuration(s.durationS)}</td>
                <td className="num">{formatTemperature(s.heatSinkEndC)}</td>
                <td className="num">{formatQuantity(s.runningFrequencyHz, "Hz")}</td>
                <td>
                  <span className={`badge badge-${s.outcome === "normal" ? "ok" : s.outcome === "failed" ? "hold" : "watch"}`}>{OUTCOME_LABEL[s.outcome]}</span>
                </td>
                <td>{s.loggedBy?.name ?? "—"}</td>
              </tr>
            ))}
            {result.rows.length === 0 && (
              <tr>
                <td colSpan={9}>No sessions match these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Pagination basePath="/sessions" params={{ coil: query.coil, outcome: query.outcome, q: query.q, sort: query.sort }} page={result.page} pageCount={result.pageCount} total={result.total} />
    </>
  );
}
