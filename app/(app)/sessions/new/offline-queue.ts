/**
 * The bench form's offline queue: a session that cannot reach the server is kept in this browser's IndexedDB
 * with its idempotency key (clientKey) and sent to POST /api/sessions when the connection returns (the online
 * event, or the next time the form opens). The server stores each key once (lib/db/sessions.ts), so a replay
 * that was in fact already stored, or two tabs replaying at once, never makes a second session. The server's
 * validation stays the authority: what it refuses is kept here, with its field errors, until the member fixes
 * and resends it or discards it.
 *
 * Plain IndexedDB rather than a wrapper library: one object store, four operations, and the team adds no new
 * npm dependencies.
 */
import type { FieldErrors } from "@/lib/validation/action-result";

export type SubmissionStatus = "queued" | "stored" | "refused";

export interface QueuedSubmission {
  clientKey: string;
  coilId: string;
  coilTag: string;
  /** The form's fields by name, as typed (the server reads them exactly as it reads the form). */
  values: Record<string, string>;
  queuedAt: string;
  status: SubmissionStatus;
  /** Stored: the session's id, for the link. */
  sessionId?: string;
  /** Refused: the server's message; queued: why the last attempt did not get through. */
  message?: string;
  fieldErrors?: FieldErrors;
}

const DATABASE = "coilyard-offline";
const STORE = "session-submissions";
/** Tells the queue's views to read it again. */
export const QUEUE_CHANGED_EVENT = "coilyard:session-queue-changed";

function openQueue(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const request = indexedDB.open(DATABASE, 1);
    request.onupgradeneeded = () => request.result.createObjectStore(STORE, { keyPath: "clientKey" });
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error);
  });
}

async function inStore<T>(mode: IDBTransactionMode, operation: (store: IDBObjectStore) => IDBRequest<T>): Promise<T> {
  const db = await openQueue();
  try {
    return await new Promise<T>((resolve, reject) => {
      const transaction = db.transaction(STORE, mode);
      const request = operation(transaction.objectStore(STORE));
      transaction.oncomplete = () => resolve(request.result);
      transaction.onerror = () => reject(transaction.error);
      transaction.onabort = () => reject(transaction.error);
    });
  } finally {
    db.close();
  }
}

function announceChange() {
  window.dispatchEvent(new Event(QUEUE_CHANGED_EVENT));
}

export async function listSubmissions(): Promise<QueuedSubmission[]> {
  const all = await inStore("readonly", (store) => store.getAll() as IDBRequest<QueuedSubmission[]>);
  return all.sort((a, b) => b.queuedAt.localeCompare(a.queuedAt));
}

export async function saveSubmission(submission: QueuedSubmission): Promise<void> {
  await inStore("readwrite", (store) => store.put(submission));
  announceChange();
}

export async function removeSubmission(clientKey: string): Promise<void> {
  await inStore("readwrite", (store) => store.delete(clientKey));
  announceChange();
}

/**
 * A version 4 UUID for one submission. crypto.randomUUID exists only in secure contexts (https, localhost); a lab
 * laptop may serve the app over plain http on the local network, where getRandomValues still works.
 */
export function newClientKey(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  bytes[6] = (bytes[6]! & 0x0f) | 0x40; // version 4 (RFC 9562 §5.4)
  bytes[8] = (bytes[8]! & 0x3f) | 0x80; // variant 10
  const hex = Array.from(bytes, (b) => b.toString(16).padStart(2, "0")).join("");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

let replaying: Promise<void> | null = null;

/** Sends every queued submission, one at a time; concurrent calls share the one pass. */
export function replayQueue(): Promise<void> {
  replaying ??= sendQueued().finally(() => {
    replaying = null;
  });
  return replaying;
}

async function sendQueued(): Promise<void> {
  for (const submission of await listSubmissions()) {
    if (submission.status !== "queued") continue;
    let response: Response;
    try {
      response = await fetch("/api/sessions", {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({ ...submission.values, clientKey: submission.clientKey }),
        credentials: "same-origin",
      });
    } catch {
      return; // Still offline: the next online event or page load tries again.
    }
    const body = (await response.json().catch(() => null)) as
      | { ok: true; data: { id: string } }
      | { ok: false; message: string; fieldErrors?: FieldErrors }
      | null;
    if (body?.ok) {
      await saveSubmission({ ...submission, status: "stored", sessionId: body.data.id, message: undefined, fieldErrors: undefined });
    } else if (body && (response.status === 400 || response.status === 404 || response.status === 422)) {
      await saveSubmission({ ...submission, status: "refused", message: body.message, fieldErrors: body.fieldErrors ?? {} });
    } else {
      // Signed out (401), not allowed (403) or a server fault: keep it queued and say why.
      const why =
        response.status === 401 ? "Sign in again; it will be sent then." : body && !body.ok ? body.message : `The server answered ${response.status}; it will be tried again.`;
      await saveSubmission({ ...submission, message: why });
      return;
    }
  }
}
