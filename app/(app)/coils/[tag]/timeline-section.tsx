/** The coil's logbook as one timeline, newest first, capped, with links to the full lists. */
import Link from "next/link";
import type { TimelineEvent } from "@/lib/db/coil-timeline";
import { formatCount, formatDateTime } from "@/lib/units/format";

interface Props {
  tag: string;
  events: TimelineEvent[];
  truncated: boolean;
  counts: { sessions: number; sweeps: number; failures: number; loans: number } | null;
}

export function TimelineSection({ tag, events, truncated, counts }: Props) {
  const q = encodeURIComponent(tag);
  return (
    <section aria-labelledby="timeline">
      <h2 id="timeline">Logbook</h2>
      {events.length === 0 ? (
        <p>Nothing logged yet.</p>
      ) : (
        <ol className="timeline" aria-label={`Logbook of ${tag}, newest first`}>
          {events.map((e, i) => (
            <li key={`${e.kind}-${i}`} className={`timeline-${e.kind}`}>
              <time dateTime={e.at.toISOString()}>{formatDateTime(e.at)}</time> — <strong>{e.href ? <Link href={e.href}>{e.title}</Link> : e.title}</strong>: {e.detail}
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
