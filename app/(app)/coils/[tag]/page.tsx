import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { hasRole } from "@/lib/auth/roles";
import { getCoilByTag } from "@/lib/db/coils";
import { listSessions } from "@/lib/db/sessions";
import { listSweeps } from "@/lib/db/sweeps";
import { listFailures } from "@/lib/db/failures";
import { formatDate, formatDateTime, formatNumber, formatQuantity } from "@/lib/units/format";
import { COIL_STATUS_LABEL, COMPONENT_KIND_LABEL, FAILURE_MODE_LABEL, TOP_LOAD_SHAPE_LABEL, TOPOLOGY_LABEL } from "@/app/ui/labels";
import { CoilStatusForm } from "./status-form";

type Props = { params: Promise<{ tag: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: decodeURIComponent((await params).tag) };
}

export default async function CoilPage({ params }: Props) {
  const user = await pageUser();
  const tag = decodeURIComponent((await params).tag);
  const coil = await getCoilByTag(tag);
  if (!coil) notFound();
  const [sessions, sweeps, failures] = await Promise.all([
    listSessions({ coilTag: coil.tag }, { pageSize: 10 }),
    listSweeps({ coilTag: coil.tag }, { pageSize: 10 }),
    listFailures({ q: coil.tag }, { pageSize: 10 }),
  ]);
  const fitted = coil.components.filter((c) => !c.removedAt);
  const removed = coil.components.filter((c) => c.removedAt);
  return (
    <>
      <div className="page-head">
        <h1>
          {coil.tag} — {coil.name}
        </h1>
        <span className={`badge badge-${coil.status}`}>{COIL_STATUS_LABEL[coil.status]}</span>
      </div>
      <p className="lede">
        Built by {coil.builderName}. {TOPOLOGY_LABEL[coil.topology]} driver.
      </p>
      <p className="no-print">
        <Link href={`/fleet/${encodeURIComponent(coil.tag)}/trends`}>Trends</Link>
        {hasRole(user.role, "steward") && (
          <>
            {" · "}
            <Link href={`/clearances/new?coil=${encodeURIComponent(coil.tag)}`}>Clear for lending</Link>
            {" · "}
            <Link href={`/loans/new?coil=${encodeURIComponent(coil.tag)}`}>Lend</Link>
          </>
        )}
      </p>
      {hasRole(user.role, "steward") && <CoilStatusForm coilId={coil.id} status={coil.status} />}

      <div className="grid-2">
        <section aria-labelledby="geometry">
          <h2 id="geometry">Secondary</h2>
          <dl className="facts">
            <dt>Form diameter</dt>
            <dd>{formatQuantity(coil.formDiameterM, "m")}</dd>
            <dt>Winding length</dt>
            <dd>{formatQuantity(coil.windingLengthM, "m")}</dd>
            <dt>Turns</dt>
            <dd>{coil.turns}</dd>
            <dt>Wire</dt>
            <dd>
              {formatQuantity(coil.wireDiameterM, "m")} {coil.wireMaterial}
              {coil.wireGaugeAwg !== null ? ` (AWG ${coil.wireGaugeAwg})` : ""}
            </dd>
            <dt>Measured DC resistance</dt>
            <dd>{formatQuantity(coil.measuredDcResistanceOhm, "Ω")}</dd>
            <dt>Measured inductance</dt>
            <dd>{formatQuantity(coil.measuredInductanceH, "H")}</dd>
            <dt>Primary</dt>
            <dd>
              {coil.primaryTurns ?? "—"} turns, {formatQuantity(coil.primaryDiameterM, "m")} diameter
            </dd>
            <dt>Environment capacitance</dt>
            <dd>
              {formatQuantity(coil.environmentCapacitanceF, "F")}
              {coil.environmentCalibratedAt ? ` (calibrated ${formatDate(coil.environmentCalibratedAt)})` : " (not yet calibrated)"}
            </dd>
          </dl>
        </section>
        <section aria-labelledby="top-loads">
          <h2 id="top-loads">Top loads</h2>
          <ul>
            {coil.topLoads.map((t) => (
              <li key={t.id}>
                {t.name} — {TOP_LOAD_SHAPE_LABEL[t.shape]}
                {t.diameterM ? `, ${formatQuantity(t.diameterM, "m")}` : ""}
                {t.tubeDiameterM ? ` × ${formatQuantity(t.tubeDiameterM, "m")} tube` : ""}
                {t.heightM ? `, ${formatQuantity(t.heightM, "m")} high` : ""}
                {t.measuredCapacitanceF ? `, measured ${formatQuantity(t.measuredCapacitanceF, "F")}` : ""}
                {t.retiredAt ? ` (retired ${formatDate(t.retiredAt)})` : ""}
              </li>
            ))}
            {coil.topLoads.length === 0 && <li>No top loads recorded.</li>}
          </ul>
        </section>
      </div>

      <section aria-labelledby="parts">
        <h2 id="parts">Fitted parts</h2>
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Part</th>
                <th scope="col">Kind</th>
                <th scope="col">Ratings</th>
                <th scope="col">Installed</th>
              </tr>
            </thead>
            <tbody>
              {fitted.map((c) => (
                <tr key={c.id}>
                  <td>
                    {c.partNumber}
                    {c.manufacturer ? ` (${c.manufacturer})` : ""}
                  </td>
                  <td>{COMPONENT_KIND_LABEL[c.kind]}</td>
                  <td>
                    {c.kind === "switch"
                      ? `${c.switchType?.toUpperCase() ?? ""} ${formatNumber(c.voltageRatingV, 0, "V")}, ${formatNumber(c.continuousCurrentA, 0, "A")} cont. / ${formatNumber(c.peakCurrentA, 0, "A")} peak, ${formatNumber(c.powerRating25CW, 0, "W")} at 25 °C, Tj max ${formatNumber(c.maxJunctionTempC, 0, "°C")}`
                      : c.kind === "heat_sink"
                        ? `${formatNumber(c.sinkThermalResistanceKPerW, 2, "K/W")}`
                        : [c.resistanceOhm ? formatQuantity(c.resistanceOhm, "Ω") : "", c.capacitanceF ? formatQuantity(c.capacitanceF, "F") : "", c.description]
                            .filter(Boolean)
                            .join(", ")}
                  </td>
                  <td>{formatDate(c.installedAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {removed.length > 0 && (
          <>
            <h3>Removed parts</h3>
            <ul>
              {removed.map((c) => (
                <li key={c.id}>
                  {c.partNumber} ({COMPONENT_KIND_LABEL[c.kind]}), {formatDate(c.installedAt)} to {formatDate(c.removedAt)}
                  {c.removalReason ? `: ${c.removalReason}` : ""}
                </li>
              ))}
            </ul>
          </>
        )}
      </section>

      <div className="grid-2">
        <section aria-labelledby="recent-sessions">
          <h2 id="recent-sessions">Recent sessions</h2>
          <ul>
            {sessions.rows.map((s) => (
              <li key={s.id}>
                {formatDateTime(s.startedAt)}: {formatNumber(s.supplyVoltageV, 1, "V")}, {formatNumber(s.supplyCurrentA, 2, "A")}, sink{" "}
                {formatNumber(s.heatSinkEndC, 1, "°C")}
              </li>
            ))}
            {sessions.total === 0 && <li>No sessions yet.</li>}
          </ul>
          {sessions.total > 10 && <Link href={`/sessions?coil=${encodeURIComponent(coil.tag)}`}>All {sessions.total} sessions</Link>}
        </section>
        <section aria-labelledby="recent-sweeps">
          <h2 id="recent-sweeps">Sweeps</h2>
          <ul>
            {sweeps.rows.map((s) => (
              <li key={s.id}>
                {formatDate(s.takenAt)}: first series resonance {formatQuantity(s.firstSeriesResonanceHz, "Hz")} ({s.topLoad?.name ?? "no top load"})
              </li>
            ))}
            {sweeps.total === 0 && <li>No sweeps yet.</li>}
          </ul>
        </section>
      </div>
      <section aria-labelledby="coil-failures">
        <h2 id="coil-failures">Failures</h2>
        <ul>
          {failures.rows.map((f) => (
            <li key={f.id}>
              {formatDate(f.occurredAt)}: {FAILURE_MODE_LABEL[f.mode]} — {f.symptoms} ({f.status === "open" ? "post-mortem open" : "post-mortem done"})
            </li>
          ))}
          {failures.total === 0 && <li>No failures recorded.</li>}
        </ul>
      </section>
    </>
  );
}
