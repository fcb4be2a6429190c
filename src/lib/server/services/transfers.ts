/**
 * The modeller's transfer tables (piecewise-linear lookup tables) and transfer sets (which parameters each domain's
 * property is carried to), named and versioned like saved variograms: saving a name again stores its next version;
 * a saved version never changes, so an export records exactly what it used.
 */
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { TRANSFER_RELATIONS, type TransferRule, type TransferSetSave, type TransferTableSave } from '$lib/schemas/exports';
import { getDb } from '$lib/server/db';
import { transferSets, transferTables, type TransferTableRow } from '$lib/server/db/export-schema';
import { inTransaction, type DbOrTx } from '$lib/server/db/transaction';
import { InvalidInput, ServiceError } from '$lib/server/errors';

export interface TransferTableView {
	id: string;
	name: string;
	version: number;
	input: SimulatedProperty;
	output: string;
	outputUnit: string;
	monotonic: 'increasing' | 'decreasing' | 'none';
	points: [number, number][];
	note: string;
	createdAt: string;
}

export interface TransferSetView {
	id: string;
	name: string;
	version: number;
	rules: TransferRule[];
	note: string;
	createdAt: string;
}

/** A transfer set with every table it names, as an export records it. */
export interface ResolvedTransferSet extends TransferSetView {
	tables: TransferTableView[];
}

function tableView(r: TransferTableRow): TransferTableView {
	return {
		id: r.id,
		name: r.name,
		version: r.version,
		input: r.input as SimulatedProperty,
		output: r.output,
		outputUnit: r.outputUnit,
		monotonic: r.monotonic,
		points: r.points,
		note: r.note,
		createdAt: r.createdAt.toISOString()
	};
}

/** Every version of every table, by name, newest version first. */
export function listTransferTables(projectId: string, db: DbOrTx = getDb()): TransferTableView[] {
	return db.select().from(transferTables).where(eq(transferTables.projectId, projectId)).orderBy(asc(transferTables.name), desc(transferTables.version)).all().map(tableView);
}

/** @throws ServiceError 404 */
export function getTransferTable(projectId: string, tableId: string, db: DbOrTx = getDb()): TransferTableView {
	const row = db
		.select()
		.from(transferTables)
		.where(and(eq(transferTables.id, tableId), eq(transferTables.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Transfer table not found.');
	return tableView(row);
}

/** Saves a table as the next version of its name (1 for a new name). */
export function saveTransferTable(projectId: string, userId: string, input: TransferTableSave, db: DbOrTx = getDb()): TransferTableView {
	return inTransaction(db, (tx) => {
		const version = nextVersion(tx, transferTables, projectId, input.name);
		const row = tx
			.insert(transferTables)
			.values({ projectId, name: input.name, version, input: input.input, output: input.output, outputUnit: input.outputUnit || '–', monotonic: input.monotonic, points: input.points, note: input.note, createdBy: userId })
			.returning()
			.get();
		return tableView(row);
	});
}

function nextVersion(tx: DbOrTx, table: typeof transferTables | typeof transferSets, projectId: string, name: string): number {
	const rows = tx.select({ name: table.name, version: table.version }).from(table).where(eq(table.projectId, projectId)).all();
	const same = rows.filter((r) => r.name.toLowerCase() === name.toLowerCase());
	return same.length ? Math.max(...same.map((r) => r.version)) + 1 : 1;
}

function setView(r: typeof transferSets.$inferSelect): TransferSetView {
	return { id: r.id, name: r.name, version: r.version, rules: r.rules as TransferRule[], note: r.note, createdAt: r.createdAt.toISOString() };
}

export function listTransferSets(projectId: string, db: DbOrTx = getDb()): TransferSetView[] {
	return db.select().from(transferSets).where(eq(transferSets.projectId, projectId)).orderBy(asc(transferSets.name), desc(transferSets.version)).all().map(setView);
}

/**
 * A transfer set with the tables it names (each a saved version).
 * @throws ServiceError 404 when the set is not in the project
 */
export function resolvedTransferSet(projectId: string, setId: string, db: DbOrTx = getDb()): ResolvedTransferSet {
	const row = db
		.select()
		.from(transferSets)
		.where(and(eq(transferSets.id, setId), eq(transferSets.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Transfer set not found.');
	const set = setView(row);
	const ids = [...new Set(set.rules.flatMap((r) => r.outputs.flatMap((o) => ('tableId' in o ? [o.tableId] : []))))];
	const tables = ids.length ? db.select().from(transferTables).where(and(eq(transferTables.projectId, projectId), inArray(transferTables.id, ids))).all().map(tableView) : [];
	return { ...set, tables };
}

/**
 * Saves a transfer set as the next version of its name, after checking that each output reads the rule's property
 * (a relation's input, a table's input) and that every table is one of the project's saved versions.
 * @throws InvalidInput (422) naming each rule and output that does not fit
 */
export function saveTransferSet(projectId: string, userId: string, input: TransferSetSave, db: DbOrTx = getDb()): ResolvedTransferSet {
	const tables = new Map(listTransferTables(projectId, db).map((t) => [t.id, t]));
	const issues: { path: (string | number)[]; message: string }[] = [];
	input.rules.forEach((rule, k) => {
		const label = PROPERTY_INFO[rule.property].label;
		rule.outputs.forEach((o, m) => {
			if ('relation' in o) {
				const rel = TRANSFER_RELATIONS[o.relation];
				if (rel.input !== rule.property) issues.push({ path: ['rules', k, 'outputs', m], message: `${rel.label} reads ${PROPERTY_INFO[rel.input].label}, not ${label}.` });
			} else {
				const t = tables.get(o.tableId);
				if (!t) issues.push({ path: ['rules', k, 'outputs', m], message: 'That table is not saved in this project.' });
				else if (t.input !== rule.property) issues.push({ path: ['rules', k, 'outputs', m], message: `Table ${t.name} reads ${PROPERTY_INFO[t.input].label}, not ${label}.` });
			}
		});
	});
	if (issues.length) throw new InvalidInput(issues.map((i) => i.message).join(' '), issues);
	const id = inTransaction(db, (tx) => {
		const version = nextVersion(tx, transferSets, projectId, input.name);
		return tx.insert(transferSets).values({ projectId, name: input.name, version, rules: input.rules, note: input.note, createdBy: userId }).returning({ id: transferSets.id }).get().id;
	});
	return resolvedTransferSet(projectId, id, db);
}
