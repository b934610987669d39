/**
 * The coil's logbook as a timeline, newest first, capped, filterable by kind (links that set `?log=`, filtered on the
 * server so it works without script and each view can be linked), with links to the full lists.
 */
import Link from "next/link";
import type { TimelineEvent, TimelineKind } from "@/lib/db/coil-timeline";
import { TIMELINE_FILTERS, type TimelineFilter } from "@/lib/validation/timeline";
import { formatCount, formatDateTime } from "@/lib/units/format";

interface Props {
  tag: string;
  events: TimelineEvent[];
  truncated: boolean;
  counts: { sessions: number; sweeps: number; failures: number; components: number; clearances: number; loans: number } | null;
  filter: TimelineFilter | null;
}

const FILTER_LABEL: Record<TimelineFilter | "all", string> = {
  all: "Everything",
  sessions: "Sessions",
  sweeps: "Sweeps",
  failures: "Failures",
  parts: "Part changes",
  clearances: "Clearances",
  loans: "Loans",
};

/** A word for each event's kind, shown beside it, so the kind never rests on the marker's colour alone. */
const KIND_LABEL: Record<TimelineKind, string> = {
  session: "session",
  sweep: "sweep",
  failure: "failure",
  "part-fitted": "part",
  "part-removed": "part",
  clearance: "clearance",
  "loan-out": "loan",
  "loan-back": "loan",
};

const countOf = (counts: Props["counts"], filter: TimelineFilter): number => (counts ? (filter === "parts" ? counts.components : counts[filter]) : 0);

export function TimelineSection({ tag, events, truncated, counts, filter }: Props) {
  const q = encodeURIComponent(tag);
  const base = `/coils/${q}`;
  return (
    <section aria-labelledby="timeline">
      <h2 id="timeline">Logbook</h2>
      <nav aria-label="Show in the logbook" className="no-print timeline-filters">
        {(["all", ...TIMELINE_FILTERS] as const).map((f) => {
          const current = (filter ?? "all") === f;
          return (
            <Link key={f} href={f === "all" ? `${base}#timeline` : `${base}?log=${f}#timeline`} aria-current={current ? "true" : undefined} className={current ? "chip chip-current" : "chip"}>
              {FILTER_LABEL[f]}
              {f !== "all" && ` (${countOf(counts, f)})`}
            </Link>
          );
        })}
      </nav>
      {events.length === 0 ? (
        <p>{filter ? `No ${FILTER_LABEL[filter].toLowerCase()} logged yet.` : "Nothing logged yet."}</p>
      ) : (
        <ol className="timeline" aria-label={`Logbook of ${tag}, newest first${filter ? `: ${FILTER_LABEL[filter].toLowerCase()}` : ""}`}>
          {events.map((e, i) => (
            <li key={`${e.kind}-${i}`} className={`timeline-event timeline-${e.kind}`}>
              <time dateTime={e.at.toISOString()}>{formatDateTime(e.at)}</time> <span className="timeline-kind">{KIND_LABEL[e.kind]}</span>{" "}
              <strong>{e.href ? <Link href={e.href}>{e.title}</Link> : e.title}</strong>: {e.detail}
            </li>
          ))}
        </ol>
      )}
      <p className="no-print">
        {truncated ? `Showing the latest ${formatCount(events.length, "entry", "entries")}. ` : ""}Full lists:{" "}
        <Link href={`/sessions?coil=${q}`}>sessions ({counts?.sessions ?? 0})</Link>, <Link href={`/sweeps?coil=${q}`}>sweeps ({counts?.sweeps ?? 0})</Link>,{" "}
        <Link href={`/failures?q=${q}`}>failures ({counts?.failures ?? 0})</Link>, <Link href="/loans">loans ({counts?.loans ?? 0})</Link>.
      </p>
    </section>
  );
}
