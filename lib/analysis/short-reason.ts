/**
 * A health reason in short form for a dashboard row: its leading clause (before ": ", "; ", " — " or a bracketed
 * aside), cut at a word boundary when still long. The full sentence stays one click away (the row's details and the
 * coil page), so nothing is lost, only deferred.
 */
export const SHORT_REASON_CHARS = 90;

const CLAUSE_BREAKS = [": ", "; ", " — ", " ("];
/** A leading clause shorter than this would say too little ("Thermal" alone); keep more of the sentence then. */
const MIN_CLAUSE_CHARS = 20;

export function shortenReason(reason: string, maxChars = SHORT_REASON_CHARS): string {
  const text = reason.trim().replace(/\.$/, "");
  const cut = CLAUSE_BREAKS.map((mark) => text.indexOf(mark)).filter((i) => i >= MIN_CLAUSE_CHARS);
  const clause = cut.length > 0 ? text.slice(0, Math.min(...cut)) : text;
  if (clause.length <= maxChars) return clause;
  const space = clause.lastIndexOf(" ", maxChars - 1);
  return `${clause.slice(0, space > MIN_CLAUSE_CHARS ? space : maxChars - 1)}…`;
}
