import type { Metadata } from "next";
import { pageUser } from "@/app/ui/page-guard";
import { getCurrentPolicy, listPolicyVersions } from "@/lib/db/policy";
import { formatChecklistLines } from "@/lib/validation/policy";
import { formatDateTime } from "@/lib/units/format";
import { PolicyForm } from "./policy-form";

export const metadata: Metadata = { title: "Lending policy" };

export default async function PolicyPage() {
  await pageUser("admin");
  const current = await getCurrentPolicy();
  const versions = await listPolicyVersions();
  const r = current.rules;
  const pct = (x: number) => String(Math.round(x * 1000) / 10);
  return (
    <>
      <h1>Lending policy</h1>
      <p className="lede">
        The rules a steward&apos;s clearance is judged by. Saving makes a new version (now version {current.version}); clearances keep the version they were signed under.
      </p>
      <PolicyForm
        current={{
          minVoltageHeadroomPct: pct(r.minVoltageHeadroom),
          minCurrentHeadroomPct: pct(r.minCurrentHeadroom),
          minThermalHeadroomPct: pct(r.minThermalHeadroom),
          minJunctionMarginK: String(r.minJunctionMarginK),
          maxSweepAgeDays: String(r.maxSweepAgeDays),
          minFailureFreeSessions: String(r.minFailureFreeSessions),
          validityDays: String(r.validityDays),
          ituRegion: String(r.ituRegion),
          acceptEstimatedMargins: r.acceptEstimatedMargins ? "on" : "",
          checklist: formatChecklistLines(r.requiredChecklist),
        }}
      />
      <h2>Version history</h2>
      <div className="table-wrap">
        <table>
          <caption>{versions.length} version{versions.length === 1 ? "" : "s"}, newest first</caption>
          <thead>
            <tr>
              <th scope="col">Version</th>
              <th scope="col">Saved</th>
              <th scope="col">By</th>
              <th scope="col">Headroom V / I / thermal</th>
              <th scope="col">Region</th>
              <th scope="col">Sweep age, clean sessions, validity</th>
              <th scope="col" className="num">Clearances</th>
              <th scope="col">Note</th>
            </tr>
          </thead>
          <tbody>
            {versions.map((v) => (
              <tr key={v.id}>
                <th scope="row">v{v.version}</th>
                <td>{formatDateTime(v.createdAt)}</td>
                <td>{v.createdBy?.name ?? "—"}</td>
                <td>
                  {pct(v.rules.minVoltageHeadroom)} / {pct(v.rules.minCurrentHeadroom)} / {pct(v.rules.minThermalHeadroom)} %
                </td>
                <td>{v.rules.ituRegion}</td>
                <td>
                  {v.rules.maxSweepAgeDays} d, {v.rules.minFailureFreeSessions}, {v.rules.validityDays} d
                </td>
                <td className="num">{v._count.clearances}</td>
                <td>{v.note || "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
