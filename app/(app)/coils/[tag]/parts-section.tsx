/** Fitted parts with their ratings, and removed parts with their dates and what replaced them. */
import Link from "next/link";
import { COMPONENT_KIND_LABEL } from "@/app/ui/labels";
import { formatDate, formatNumber, formatQuantity } from "@/lib/units/format";

interface Part {
  id: string;
  kind: string;
  partNumber: string;
  manufacturer: string;
  description: string;
  switchType: string | null;
  voltageRatingV: number | null;
  continuousCurrentA: number | null;
  peakCurrentA: number | null;
  powerRating25CW: number | null;
  maxJunctionTempC: number | null;
  thermalResistanceJcKPerW: number | null;
  caseToSinkKPerW: number | null;
  sinkThermalResistanceKPerW: number | null;
  sinkMassKg: number | null;
  resistanceOhm: number | null;
  capacitanceF: number | null;
  clampVoltageV: number | null;
  installedAt: Date;
  removedAt: Date | null;
  removalReason: string | null;
  replacedById: string | null;
}

export function describeRatings(c: Part): string {
  if (c.kind === "switch") {
    return [
      c.switchType?.toUpperCase(),
      c.voltageRatingV !== null && formatQuantity(c.voltageRatingV, "V"),
      c.continuousCurrentA !== null && `${formatQuantity(c.continuousCurrentA, "A")} cont.`,
      c.peakCurrentA !== null && `${formatQuantity(c.peakCurrentA, "A")} peak`,
      c.powerRating25CW !== null && `${formatQuantity(c.powerRating25CW, "W")} at 25 °C`,
      c.maxJunctionTempC !== null && `Tj max ${formatNumber(c.maxJunctionTempC, 0, "°C")}`,
      c.thermalResistanceJcKPerW !== null && `Rθjc ${formatNumber(c.thermalResistanceJcKPerW, 2, "K/W")}`,
      c.caseToSinkKPerW !== null && `case–sink ${formatNumber(c.caseToSinkKPerW, 2, "K/W")}`,
    ].filter(Boolean).join(", ");
  }
  if (c.kind === "fan") {
    return c.sinkThermalResistanceKPerW !== null ? `sink Rθsa ${formatNumber(c.sinkThermalResistanceKPerW, 2, "K/W")} with the fan` : "with-fan Rθsa not recorded (margins estimate it)";
  }
  if (c.kind === "heat_sink") {
    return [c.sinkThermalResistanceKPerW !== null && `Rθsa ${formatNumber(c.sinkThermalResistanceKPerW, 2, "K/W")}`, c.sinkMassKg !== null && formatQuantity(c.sinkMassKg * 1000, "g")].filter(Boolean).join(", ");
  }
  return [c.resistanceOhm !== null && formatQuantity(c.resistanceOhm, "Ω"), c.capacitanceF !== null && formatQuantity(c.capacitanceF, "F"), c.clampVoltageV !== null && `clamps at ${formatQuantity(c.clampVoltageV, "V")}`, c.description]
    .filter(Boolean)
    .join(", ");
}

export function PartsSection({ tag, parts, canEdit }: { tag: string; parts: Part[]; canEdit: boolean }) {
  const fitted = parts.filter((c) => !c.removedAt);
  const removed = parts.filter((c) => c.removedAt).sort((a, b) => b.removedAt!.getTime() - a.removedAt!.getTime());
  const byId = new Map(parts.map((p) => [p.id, p]));
  const base = `/coils/${encodeURIComponent(tag)}`;
  return (
    <section aria-labelledby="parts">
      <div className="page-head">
        <h2 id="parts">Fitted parts</h2>
        {canEdit && (
          <Link href={`${base}/parts/new`} className="no-print">
            Fit a part
          </Link>
        )}
      </div>
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">Part</th>
              <th scope="col">Kind</th>
              <th scope="col">Ratings</th>
              <th scope="col">Fitted</th>
              {canEdit && <th scope="col" className="no-print">Change</th>}
            </tr>
          </thead>
          <tbody>
            {fitted.map((c) => (
              <tr key={c.id}>
                <th scope="row">
                  {c.partNumber}
                  {c.manufacturer ? ` (${c.manufacturer})` : ""}
                </th>
                <td>{COMPONENT_KIND_LABEL[c.kind]}</td>
                <td>{describeRatings(c) || "—"}</td>
                <td>{formatDate(c.installedAt)}</td>
                {canEdit && (
                  <td className="no-print">
                    <Link href={`${base}/parts/${c.id}/replace`} aria-label={`Replace ${c.partNumber}`}>
                      Replace
                    </Link>
                  </td>
                )}
              </tr>
            ))}
            {fitted.length === 0 && (
              <tr>
                <td colSpan={canEdit ? 5 : 4}>No parts recorded.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      {removed.length > 0 && (
        <>
          <h3 id="removed-parts">Removed parts</h3>
          <div className="table-wrap">
            <table aria-labelledby="removed-parts">
              <thead>
                <tr>
                  <th scope="col">Part</th>
                  <th scope="col">Kind</th>
                  <th scope="col">Fitted</th>
                  <th scope="col">Removed</th>
                  <th scope="col">Why</th>
                  <th scope="col">Replaced by</th>
                </tr>
              </thead>
              <tbody>
                {removed.map((c) => (
                  <tr key={c.id}>
                    <th scope="row">{c.partNumber}</th>
                    <td>{COMPONENT_KIND_LABEL[c.kind]}</td>
                    <td>{formatDate(c.installedAt)}</td>
                    <td>{formatDate(c.removedAt)}</td>
                    <td>{c.removalReason ?? "—"}</td>
                    <td>{c.replacedById ? (byId.get(c.replacedById)?.partNumber ?? "—") : "—"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
    </section>
  );
}
