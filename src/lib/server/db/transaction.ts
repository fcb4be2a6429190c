import type { Db } from './index';

/** A database or a transaction on one; services take either so a caller can group writes. */
export type DbOrTx = Db | Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * Runs `fn` in a transaction on `db`, or in a savepoint when `db` already is a transaction, so a service's
 * writes are all or nothing whether or not its caller groups it with others. Synchronous, like better-sqlite3.
 */
export function inTransaction<T>(db: DbOrTx, fn: (tx: DbOrTx) => T): T {
	return (db as Db).transaction((tx) => fn(tx));
}
