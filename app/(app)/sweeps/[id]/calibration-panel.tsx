import Link from "next/link";
import { formatDate, formatDateTime, formatQuantity } from "@/lib/units/format";
import type { CalibrationSummary } from "@/lib/analysis/sweep-report";

export function CalibrationPanel({ coil, calibration, currentSweepId }: { coil: { tag: string; environmentCapacitanceF: number | null; environmentCalibratedAt: Date | null }; calibration: CalibrationSummary; currentSweepId: string }) {
  return (
    <section aria-labelledby="calibration">
      <h2 id="calibration">Environment capacitance of {coil.tag}</h2>
      <p>
        Stored: <strong>{formatQuantity(coil.environmentCapacitanceF, "F")}</strong>
        {coil.environmentCalibratedAt ? ` (calibrated ${formatDate(coil.environmentCalibratedAt)})` : " (not calibrated)"}. For each sweep, the capacitance that
        resonates with the model inductance at the measured first series resonance, less the self-capacitance and the top load&apos;s; the median over all sweeps is kept.
      </p>
      {calibration.ok ? (
        <>
          <div className="table-wrap">
            <table>
              <caption>Per-sweep values (spread {formatQuantity(calibration.calibration.spread, "F")})</caption>
              <thead>
                <tr>
                  <th scope="col">Sweep</th>
                  <th scope="col" className="num">First series resonance</th>
                  <th scope="col" className="num">Top load</th>
                  <th scope="col" className="num">Environment</th>
                </tr>
              </thead>
              <tbody>
                {calibration.calibration.perMeasurement.map((m, i) => {
                  const sweep = calibration.sweeps[i]!;
                  return (
                    <tr key={sweep.id}>
                      <th scope="row">{sweep.id === currentSweepId ? `${formatDateTime(sweep.takenAt)} (this sweep)` : <Link href={`/sweeps/${sweep.id}`}>{formatDateTime(sweep.takenAt)}</Link>}</th>
                      <td className="num">{formatQuantity(m.firstSeriesResonance, "Hz", 4)}</td>
                      <td className="num">{formatQuantity(m.topLoadCapacitance, "F")}</td>
                      <td className="num">{formatQuantity(m.environmentCapacitance, "F")}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <ul>
            {calibration.calibration.notes.map((note) => (
              <li key={note}>{note}</li>
            ))}
          </ul>
        </>
      ) : (
        <p>{calibration.reason}</p>
      )}
    </section>
  );
}
