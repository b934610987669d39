"use client";

import Link from "next/link";
import { useCallback, useEffect, useState } from "react";
import { listSubmissions, QUEUE_CHANGED_EVENT, removeSubmission, replayQueue, type QueuedSubmission } from "./offline-queue";

const STATUS_LABEL: Record<QueuedSubmission["status"], string> = { queued: "Waiting to send", stored: "Stored", refused: "Refused" };

/**
 * What this device holds of the bench form's offline queue: waiting, stored (with the link) and refused (with the
 * server's reasons, to load back into the form and fix). Sends the waiting ones when the page opens, whenever the
 * browser comes back online, and every RETRY_WAITING_MS while it is online: on a flaky connection the first attempt
 * after reconnecting can fail again, and nothing else would wake the queue until the page is reopened.
 */
const RETRY_WAITING_MS = 15_000;

export function OfflineQueuePanel({ coilId, onLoad }: { coilId: string; onLoad: (submission: QueuedSubmission) => void }) {
  const [submissions, setSubmissions] = useState<QueuedSubmission[] | null>(null);
  const [unavailable, setUnavailable] = useState(false);

  const refresh = useCallback(() => {
    listSubmissions().then(setSubmissions, () => setUnavailable(true));
  }, []);

  useEffect(() => {
    const send = () => void replayQueue().finally(refresh);
    refresh();
    if (navigator.onLine) send();
    window.addEventListener("online", send);
    window.addEventListener(QUEUE_CHANGED_EVENT, refresh);
    const retry = window.setInterval(() => {
      if (navigator.onLine) send();
    }, RETRY_WAITING_MS);
    return () => {
      window.clearInterval(retry);
      window.removeEventListener("online", send);
      window.removeEventListener(QUEUE_CHANGED_EVENT, refresh);
    };
  }, [refresh]);

  if (unavailable) return <p className="hint">This browser keeps no offline queue (its storage is turned off); a session saved without a connection is lost.</p>;
  if (!submissions || submissions.length === 0) return null;
  return (
    <section aria-labelledby="offline-queue-heading" className="stack" data-testid="offline-queue">
      <h2 id="offline-queue-heading">Saved on this device</h2>
      <p className="hint">Sessions saved without a connection are sent when it returns. The server checks each one; each is stored once.</p>
      <ul className="stack">
        {submissions.map((s) => (
          <li key={s.clientKey} data-status={s.status} aria-label={`${s.coilTag} session started ${s.values.startedAt?.replace("T", " ") ?? ""}: ${STATUS_LABEL[s.status]}`}>
            <strong>{STATUS_LABEL[s.status]}</strong> — {s.coilTag}, started {s.values.startedAt?.replace("T", " ")}, {s.values.supplyVoltageV} for {s.values.durationS}
            {s.status === "queued" && s.message && <span className="hint"> ({s.message})</span>}
            {s.status === "stored" && s.sessionId && (
              <>
                {" "}
                <Link href={`/sessions/${s.sessionId}`}>Open the stored session</Link>{" "}
                <button type="button" onClick={() => void removeSubmission(s.clientKey)}>
                  Clear from this list
                </button>
              </>
            )}
            {s.status === "refused" && (
              <>
                <p className="notice danger">{s.message}</p>
                <ul>
                  {Object.entries(s.fieldErrors ?? {}).flatMap(([field, messages]) => messages.map((m) => <li key={`${field}:${m}`}>{m}</li>))}
                </ul>
                {s.coilId === coilId ? (
                  <button type="button" onClick={() => onLoad(s)}>
                    Load into the form to fix
                  </button>
                ) : (
                  <Link href={`/sessions/new?coil=${encodeURIComponent(s.coilTag)}`}>Open {s.coilTag}&apos;s form to fix it</Link>
                )}{" "}
                <button type="button" onClick={() => void removeSubmission(s.clientKey)}>
                  Discard
                </button>
              </>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
