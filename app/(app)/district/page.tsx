import type { Metadata } from "next";
import { forbidden } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { OpenSiteButton } from "@/app/ui/site-switcher";
import { getDistrictHealth, type SiteFleetHealth } from "@/lib/db/district";
import { formatDateTime } from "@/lib/units/format";

export const metadata: Metadata = { title: "District" };

type Figure = (row: SiteFleetHealth) => number;

const COLUMNS: { heading: string; figure: Figure; tone?: string }[] = [
  { heading: "Coils", figure: (r) => r.coils },
  { heading: "Fine", figure: (r) => r.health.fine, tone: "fine" },
  { heading: "Watch", figure: (r) => r.health.watch, tone: "watch" },
  { heading: "Hold", figure: (r) => r.health.hold, tone: "hold" },
  { heading: "Not enough data", figure: (r) => r.health.notEnoughData },
  { heading: "Open failures", figure: (r) => r.openFailures, tone: "open" },
  { heading: "On loan", figure: (r) => r.onLoan },
  { heading: "Overdue loans", figure: (r) => r.overdueLoans, tone: "overdue" },
  { heading: "Cleared now", figure: (r) => r.cleared },
];

/** Every site's fleet at a glance, for organisation admins; a site's name opens its dashboard. */
export default async function DistrictPage() {
  const user = await pageUser("member");
  if (!user.organisationAdmin) forbidden();
  const rows = await getDistrictHealth(user.scope);
  const outOfDate = rows.filter((r) => r.outOfDate > 0);
  return (
    <>
      <h1>District</h1>
      <p className="lede">
        Every site&apos;s fleet at a glance. Choose a site&apos;s name to switch to it and open its dashboard. Health compares each coil&apos;s logbook with
        its site&apos;s lending policy; it records each team&apos;s checks and does not say a build is safe.
      </p>
      <p className="notice">
        Health here is each coil&apos;s judgement as its site&apos;s dashboard last worked it out, so a glance at the whole district stays quick. Failures,
        loans and clearances are counted as they stand now.
        {outOfDate.length > 0
          ? ` Out of date: ${outOfDate.map((r) => `${r.outOfDate} of ${r.coils} coils at ${r.site.name}`).join("; ")} (recorded since, never judged, or due for another look); opening that site brings them up to date.`
          : " Every judgement is up to date."}
      </p>
      <div className="table-wrap">
        <table>
          <caption>
            {rows.length} site{rows.length === 1 ? "" : "s"}, {rows.reduce((n, r) => n + r.coils, 0)} coils
          </caption>
          <thead>
            <tr>
              <th scope="col">Site</th>
              {COLUMNS.map((c) => (
                <th scope="col" key={c.heading}>
                  {c.heading}
                </th>
              ))}
              <th scope="col">Oldest judgement</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.site.id}>
                <th scope="row">
                  <OpenSiteButton slug={row.site.slug} name={row.site.name} />
                  {row.site.id === user.site.id && <span className="muted"> (current)</span>}
                </th>
                {COLUMNS.map((c) => {
                  const value = c.figure(row);
                  return <td key={c.heading}>{value > 0 && c.tone ? <span className={`badge badge-${c.tone}`}>{value}</span> : value}</td>;
                })}
                <td>{row.oldestJudgementAt ? formatDateTime(row.oldestJudgementAt) : "none yet"}</td>
              </tr>
            ))}
          </tbody>
          {rows.length > 1 && (
            <tfoot>
              <tr>
                <th scope="row">All sites</th>
                {COLUMNS.map((c) => (
                  <td key={c.heading}>{rows.reduce((n, r) => n + c.figure(r), 0)}</td>
                ))}
                <td />
              </tr>
            </tfoot>
          )}
        </table>
      </div>
    </>
  );
}
