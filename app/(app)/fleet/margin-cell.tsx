import type { Margin } from "@/lib/calc/margin";
import type { MarginBrief } from "@/lib/analysis/margin-brief";
import { formatPercent } from "@/lib/units/format";

const STATUS_WORDS: Record<Margin["status"], string> = { ok: "ok", thin: "thin", exceeded: "exceeded", unknown: "unknown" };

/** One margin's headroom and its status, e.g. "34 % ok". */
export function MarginCell({ margin }: { margin: MarginBrief | null | undefined }) {
  if (!margin) return <span className="muted">—</span>;
  return (
    <span className={`badge badge-${margin.status === "ok" ? "ok" : margin.status}`} title={margin.formula}>
      {margin.headroom === null ? "?" : formatPercent(margin.headroom)} {STATUS_WORDS[margin.status]}
    </span>
  );
}
