/**
 * Several independent connections to the integration database, each with its own copy of lib/db, so writes
 * fired with Promise.all really run side by side. One PrismaClient runs its interactive transactions one at a
 * time (the better-sqlite3 adapter holds a mutex), which would hide every race; separate clients interleave
 * their statements the way separate server processes, or a PostgreSQL connection pool, do.
 */
import { vi } from "vitest";

async function loadWriter() {
  const [client, coils, components, loans, failures, clearances, users, policy, throttle, sessions] = await Promise.all([
    import("@/lib/db/client"),
    import("@/lib/db/coils"),
    import("@/lib/db/components"),
    import("@/lib/db/loans"),
    import("@/lib/db/failures"),
    import("@/lib/db/clearances"),
    import("@/lib/db/users"),
    import("@/lib/db/policy"),
    import("@/lib/db/sign-in-throttle"),
    import("@/lib/db/sessions"),
  ]);
  return { prisma: client.prisma, coils, components, loans, failures, clearances, users, policy, throttle, sessions };
}

export type Writer = Awaited<ReturnType<typeof loadWriter>>;

/** `count` writers, each on its own connection. Close them with closeWriters. */
export async function openWriters(count: number): Promise<Writer[]> {
  // lib/db/client caches its client on globalThis outside production; hide the shared one while loading.
  const global = globalThis as { coilyardPrisma?: unknown };
  const shared = global.coilyardPrisma;
  const writers: Writer[] = [];
  try {
    for (let i = 0; i < count; i++) {
      vi.resetModules();
      delete global.coilyardPrisma;
      const writer = await loadWriter();
      // SQLite's busy handler sleeps inside the synchronous driver call, so a writer waiting for the lock here
      // would stall the very event loop the lock holder needs to commit. Test writers give up at once instead
      // and rely on lib/db/serializable.ts's retry, as a writer in another process would after its wait.
      if ((process.env.DATABASE_URL ?? "file:").startsWith("file:")) await writer.prisma.$queryRawUnsafe("PRAGMA busy_timeout = 0");
      writers.push(writer);
    }
  } finally {
    global.coilyardPrisma = shared;
    vi.resetModules();
  }
  return writers;
}

export async function closeWriters(writers: Writer[]): Promise<void> {
  await Promise.all(writers.map((w) => w.prisma.$disconnect()));
}

/** The settled results split: what was stored, and the errors of the ones refused. */
export function outcomes<T>(settled: PromiseSettledResult<T>[]) {
  return {
    stored: settled.flatMap((s) => (s.status === "fulfilled" ? [s.value] : [])),
    refused: settled.flatMap((s) => (s.status === "rejected" ? [s.reason as Error & { reason?: string }] : [])),
  };
}
