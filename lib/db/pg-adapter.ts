/**
 * The pg driver adapter for the app, with one repair.
 *
 * Prisma 6.19 ends an interactive transaction by sending COMMIT through the adapter and only then calling the
 * adapter's commit(), which is what hands the connection back to the pool. When PostgreSQL refuses the COMMIT
 * itself (a serialization failure found at commit, SQLSTATE 40001, which Serializable transactions can meet;
 * see serializable.ts), commit() is never called and the connection stays checked out for good: a few such
 * conflicts exhaust the pool and the app hangs. PostgreSQL has already rolled the transaction back when COMMIT
 * fails, so the wrapper releases the connection through the adapter's rollback() and passes the error on.
 * Remove when Prisma releases the connection itself.
 */
import { PrismaPg } from "@prisma/adapter-pg";

type Query = { sql: string };
type Transaction = { executeRaw(query: Query): Promise<number>; rollback(): Promise<void> };
type Adapter = { startTransaction(isolationLevel?: string): Promise<Transaction> };
type Factory = { connect(): Promise<Adapter> };

function releaseOnFailedCommit(tx: Transaction): Transaction {
  return new Proxy(tx, {
    get(target, property, receiver) {
      if (property !== "executeRaw") return Reflect.get(target, property, receiver);
      return async (query: Query) => {
        try {
          return await target.executeRaw(query);
        } catch (error) {
          if (query.sql === "COMMIT") await target.rollback().catch(() => undefined);
          throw error;
        }
      };
    },
  });
}

export function createPostgresAdapter(connectionString: string, max: number): PrismaPg {
  const factory = new PrismaPg({ connectionString, max }) as unknown as Factory;
  const connect = factory.connect.bind(factory);
  factory.connect = async () => {
    const adapter = await connect();
    const startTransaction = adapter.startTransaction.bind(adapter);
    adapter.startTransaction = async (isolationLevel?: string) => releaseOnFailedCommit(await startTransaction(isolationLevel));
    return adapter;
  };
  return factory as unknown as PrismaPg;
}
