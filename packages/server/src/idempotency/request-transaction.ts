import { AsyncLocalStorage } from 'node:async_hooks';
import type { DataSource, QueryRunner, ReplicationMode } from 'typeorm';

/** The one connection and transaction a request with an idempotency key runs in. */
interface Scope {
  shared: QueryRunner;
}

const scopes = new AsyncLocalStorage<Scope>();
const INSTALLED = Symbol('beadroll.requestTransactions');

/**
 * Makes `dataSource` hand every query of a request that runs inside {@link RequestTransaction.run}
 * to that request's one connection, inside its one transaction: the ledger's own transactions
 * become savepoints of it, and the reads that build the answer see the request's own writes. So
 * the idempotency record (written last, with the answer) commits together with every write of
 * the request, or nothing does. Requests outside a scope are untouched.
 */
export function installRequestTransactions(dataSource: DataSource): void {
  const ds = dataSource as DataSource & { [INSTALLED]?: true };
  if (ds[INSTALLED]) return;
  ds[INSTALLED] = true;
  const original = ds.createQueryRunner.bind(ds);
  ds.createQueryRunner = (mode?: ReplicationMode): QueryRunner => scopes.getStore()?.shared ?? original(mode);
}

/**
 * A view of the request's runner for the code that borrows it: releasing it does nothing (the
 * request releases it at the end), code outside any transaction of its own sees no active
 * transaction (so TypeORM's save opens a savepoint), and each such bare statement runs in a
 * savepoint of its own, so a statement that fails and is caught (a unique violation answered as
 * "taken") does not poison the rest of the request.
 */
function borrowed(real: QueryRunner): QueryRunner {
  const depth = () => (real as unknown as { transactionDepth: number }).transactionDepth;
  let bare: Promise<unknown> = Promise.resolve();
  return new Proxy(real, {
    get(target, prop, receiver) {
      const query = (sql: string, params?: unknown[], structured?: boolean): Promise<unknown> =>
        (target.query as (s: string, p?: unknown[], st?: boolean) => Promise<unknown>)(
          sql,
          params,
          structured,
        );
      if (prop === 'release') return async () => undefined;
      if (prop === 'isTransactionActive') return depth() > 1;
      if (prop === 'query')
        return (sql: string, params?: unknown[], structured?: boolean) => {
          if (depth() > 1) return query(sql, params, structured);
          const run = bare.then(async () => {
            await target.query('SAVEPOINT beadroll_statement');
            try {
              const out = await query(sql, params, structured);
              await target.query('RELEASE SAVEPOINT beadroll_statement');
              return out;
            } catch (err) {
              await target.query('ROLLBACK TO SAVEPOINT beadroll_statement');
              throw err;
            }
          });
          bare = run.catch(() => undefined);
          return run;
        };
      const value: unknown = Reflect.get(target, prop, receiver);
      return typeof value === 'function' ? (value as (...a: unknown[]) => unknown).bind(target) : value;
    },
  });
}

/** One request's transaction: begin, run the handler inside it, then commit or roll back. */
export class RequestTransaction {
  private constructor(
    private readonly real: QueryRunner,
    private readonly shared: QueryRunner,
  ) {}

  /** Takes a connection and starts the transaction. */
  static async begin(dataSource: DataSource): Promise<RequestTransaction> {
    installRequestTransactions(dataSource);
    const real = dataSource.createQueryRunner('master');
    await real.connect();
    try {
      await real.startTransaction('READ COMMITTED');
    } catch (err) {
      await real.release();
      throw err;
    }
    return new RequestTransaction(real, borrowed(real));
  }

  /** A statement of the request's own bookkeeping, outside any savepoint. */
  query<T = unknown>(sql: string, params?: unknown[]): Promise<T> {
    return this.real.query(sql, params) as Promise<T>;
  }

  /** Runs `fn` so that every query it makes through the data source uses this transaction. */
  run<T>(fn: () => Promise<T>): Promise<T> {
    return scopes.run({ shared: this.shared }, fn);
  }

  async commit(): Promise<void> {
    try {
      await this.real.commitTransaction();
    } finally {
      await this.real.release();
    }
  }

  async rollback(): Promise<void> {
    try {
      if (this.real.isTransactionActive) await this.real.rollbackTransaction();
    } catch {
      // the connection is gone; the server rolled the transaction back itself
    } finally {
      await this.real.release();
    }
  }
}

/**
 * Runs `fn` outside any request's transaction: work a request merely starts (a background pass
 * that must commit on its own, such as the log sequencer's) takes connections of its own and
 * never runs statements, BEGIN or COMMIT included, on the request's connection.
 */
export function outsideRequestTransaction<T>(fn: () => T): T {
  return scopes.exit(fn);
}
