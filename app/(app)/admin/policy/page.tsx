import type { Metadata } from "next";
import { pageUser } from "@/app/ui/page-guard";
import { getCurrentPolicy, listPolicyVersions } from "@/lib/db/policy";
import { comparePolicyToDefault } from "@/lib/calc/policy-tightening";
import type { ClearancePolicyRules } from "@/lib/calc/clearance-policy";
import { formatChecklistLines } from "@/lib/validation/policy";
import { formatDateTime } from "@/lib/units/format";
import { PolicyForm, type PolicyFormValues } from "./policy-form";

export const metadata: Metadata = { title: "Lending policy" };

const pct = (x: number) => String(Math.round(x * 1000) / 10);

function formValues(r: ClearancePolicyRules): PolicyFormValues {
  return {
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
  };
}

/**
 * The organisation's default policy (edited by an organisation admin) and the current site's tightening of it (edited
 * by the site's admin), with what the site lends by: the stricter of each threshold.
 */
export default async function PolicyPage() {
  const user = await pageUser("admin");
  const [effective, versions] = await Promise.all([getCurrentPolicy(user.scope), listPolicyVersions(user.scope)]);
  const { organisationDefault, siteOwn } = effective;
  const differences = siteOwn ? comparePolicyToDefault(organisationDefault.rules, siteOwn.rules) : [];
  const tightenings = differences.filter((d) => d.relation === "stricter");
  const overtaken = differences.filter((d) => d.relation === "looser");
  const site = user.site.name;
  return (
    <>
      <h1>Lending policy</h1>
      <p className="lede">
        The rules a steward&apos;s clearance is judged by. {site} lends by the organisation&apos;s policy, tightened where {site} asks more: the stricter of each
        threshold applies (now version {effective.version}). Saving makes a new version; clearances keep the version they were signed under.
      </p>

      <section aria-labelledby="site-policy-heading">
        <h2 id="site-policy-heading">{site}&apos;s tightening</h2>
        {tightenings.length === 0 ? (
          <p>{site} asks nothing beyond the organisation&apos;s policy.</p>
        ) : (
          <ul aria-label={`Where ${site} asks more than the organisation`}>
            {tightenings.map((d) => (
              <li key={`${d.field}:${d.itemId ?? ""}`}>{d.message}</li>
            ))}
          </ul>
        )}
        {overtaken.length > 0 && (
          <p className="notice warn">
            The organisation&apos;s policy has since asked more than {site}&apos;s saved rules here, so the organisation&apos;s applies:{" "}
            {overtaken.map((d) => d.message).join(" ")}
          </p>
        )}
        <p className="muted">
          The form shows what {site} lends by now. A site may only tighten: a higher headroom, junction margin or count of clean sessions, a fresher sweep, a
          shorter validity, no estimated margins, more checklist items. Anything looser is refused, field by field.
        </p>
        <PolicyForm kind="site" label={`${site}'s lending policy`} current={formValues(effective.rules)} />
      </section>

      <section aria-labelledby="organisation-policy-heading">
        <h2 id="organisation-policy-heading">The organisation&apos;s policy</h2>
        <p>
          Version {organisationDefault.version}, the least every site lends by
          {user.organisationAdmin ? "." : "; an organisation admin changes it."}
        </p>
        {user.organisationAdmin ? (
          <PolicyForm kind="organisation" label="The organisation's lending policy" current={formValues(organisationDefault.rules)} />
        ) : (
          <dl className="facts">
            <dt>Headroom V / I / thermal</dt>
            <dd>
              {pct(organisationDefault.rules.minVoltageHeadroom)} / {pct(organisationDefault.rules.minCurrentHeadroom)} / {pct(organisationDefault.rules.minThermalHeadroom)} %
            </dd>
            <dt>Junction margin</dt>
            <dd>{organisationDefault.rules.minJunctionMarginK} K</dd>
            <dt>ITU region</dt>
            <dd>{organisationDefault.rules.ituRegion}</dd>
            <dt>Sweep age, clean sessions, validity</dt>
            <dd>
              {organisationDefault.rules.maxSweepAgeDays} d, {organisationDefault.rules.minFailureFreeSessions}, {organisationDefault.rules.validityDays} d
            </dd>
            <dt>Checklist</dt>
            <dd>{organisationDefault.rules.requiredChecklist.length} items</dd>
          </dl>
        )}
      </section>

      <h2>Version history</h2>
      <div className="table-wrap">
        <table>
          <caption>
            {versions.length} version{versions.length === 1 ? "" : "s"}, newest first
          </caption>
          <thead>
            <tr>
              <th scope="col">Version</th>
              <th scope="col">Of</th>
              <th scope="col">Saved</th>
              <th scope="col">By</th>
              <th scope="col">Headroom V / I / thermal</th>
              <th scope="col">Region</th>
              <th scope="col">Sweep age, clean sessions, validity</th>
              <th scope="col" className="num">
                {site}&apos;s clearances
              </th>
              <th scope="col">Note</th>
            </tr>
          </thead>
          <tbody>
            {versions.map((v) => (
              <tr key={v.id}>
                <th scope="row">v{v.version}</th>
                <td>{v.siteId === null ? "Organisation" : site}</td>
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
