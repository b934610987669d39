import type { Metadata } from "next";
import { pageUser } from "@/app/ui/page-guard";
import { getPartReliability } from "@/lib/db/fleet";
import { formatNumber } from "@/lib/units/format";
import { COMPONENT_KIND_LABEL, FAILURE_MODE_LABEL } from "@/app/ui/labels";

export const metadata: Metadata = { title: "Fleet reliability" };

const hours = (h: number | null) => (h === null ? "—" : Number.isFinite(h) ? formatNumber(h, h < 10 ? 1 : 0, "h") : "no ceiling");

export default async function ReliabilityPage() {
  const user = await pageUser();
  const { parts, unattributedFailures } = await getPartReliability(user.scope);
  return (
    <>
      <h1>Fleet reliability per part</h1>
      <p className="lede">
        Operating hours are the run sessions logged while each part was fitted, pooled by part number across coils. MTBF assumes a constant failure rate; the
        interval is two-sided at 95 %. With no failure there is no point estimate, only a lower bound.
      </p>
      {unattributedFailures > 0 && (
        <p className="notice warn">
          {unattributedFailures} failure{unattributedFailures === 1 ? " is" : "s are"} not linked to a part, so {unattributedFailures === 1 ? "it is" : "they are"} not counted here.
        </p>
      )}
      <div className="table-wrap">
        <table>
          <caption>{parts.length} part numbers, most failures first</caption>
          <thead>
            <tr>
              <th scope="col">Part number</th>
              <th scope="col">Kind</th>
              <th scope="col" className="num">Fitted</th>
              <th scope="col" className="num">Operating hours</th>
              <th scope="col" className="num">Failures</th>
              <th scope="col">Failure modes</th>
              <th scope="col" className="num">MTBF</th>
              <th scope="col">95 % interval</th>
            </tr>
          </thead>
          <tbody>
            {parts.map((p) => (
              <tr key={p.partKey} className={p.failures > 0 ? "row-attention" : undefined}>
                <th scope="row">{p.partNumber}</th>
                <td>{p.kinds.map((k) => COMPONENT_KIND_LABEL[k] ?? k).join(", ")}</td>
                <td className="num">{p.records}</td>
                <td className="num">{formatNumber(p.operatingHours, 1)}</td>
                <td className="num">{p.failures > 0 ? <span className="badge badge-hold">{p.failures}</span> : 0}</td>
                <td>{p.failureModes.length > 0 ? p.failureModes.map(([mode, count]) => `${count} × ${FAILURE_MODE_LABEL[mode] ?? mode}`).join(", ") : "—"}</td>
                <td className="num">{hours(p.mtbfHours)}</td>
                <td>
                  {hours(p.mtbfLowHours)} to {hours(p.mtbfHighHours)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
