import { describe, expect, it } from 'vitest';
import { openDatabase } from '../../../src/lib/server/db';
import { inTransaction } from '../../../src/lib/server/db/transaction';

function db() {
	const d = openDatabase(':memory:');
	d.$client.exec('CREATE TABLE t (x INTEGER)');
	return d;
}
const insert = (d: { $client: { prepare(s: string): { run(...a: unknown[]): unknown } } }, x: number) => d.$client.prepare('INSERT INTO t VALUES (?)').run(x);
const rows = (d: ReturnType<typeof db>) => (d.$client.prepare('SELECT x FROM t ORDER BY x').all() as { x: number }[]).map((r) => r.x);

describe('inTransaction(db, fn)', () => {
	it('inTransaction(db, fn) commits what fn wrote and returns its value', () => {
		const d = db();
		expect(inTransaction(d, () => (insert(d, 1), insert(d, 2), 'done'))).toBe('done');
		expect(rows(d)).toEqual([1, 2]);
	});

	it('inTransaction(db, fn) writes nothing when fn throws, and rethrows', () => {
		const d = db();
		expect(() =>
			inTransaction(d, () => {
				insert(d, 1);
				throw new Error('refused');
			})
		).toThrow('refused');
		expect(rows(d)).toEqual([]);
	});

	it('inTransaction(tx, fn) inside a transaction is a savepoint: its failure undoes only its own writes', () => {
		const d = db();
		inTransaction(d, (tx) => {
			insert(d, 1);
			try {
				inTransaction(tx, () => {
					insert(d, 2);
					throw new Error('inner');
				});
			} catch {
				// The outer work goes on without the inner writes.
			}
			insert(d, 3);
		});
		expect(rows(d)).toEqual([1, 3]);
	});
});
