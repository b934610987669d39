/**
 * What a list of coils shows of a session's margins: each margin's headroom, status and formula, without the inputs
 * and notes the session page explains them with. The per-coil summary stores this brief form (a tenth of the full
 * margins' size), so the dashboard reads and parses ~300 bytes a coil instead of ~3.5 kB.
 */
import type { Margin } from "../calc/margin";
import type { SessionMargins } from "../calc/session-margins";

export type MarginBrief = Pick<Margin, "kind" | "headroom" | "status" | "formula" | "estimated">;

export interface SessionMarginsBrief {
  voltage: MarginBrief;
  current: MarginBrief;
  thermal: MarginBrief;
}

function briefMargin({ kind, headroom, status, formula, estimated }: Margin): MarginBrief {
  return { kind, headroom, status, formula, estimated };
}

export function briefSessionMargins(margins: SessionMargins): SessionMarginsBrief {
  return { voltage: briefMargin(margins.voltage), current: briefMargin(margins.current), thermal: briefMargin(margins.thermal) };
}
