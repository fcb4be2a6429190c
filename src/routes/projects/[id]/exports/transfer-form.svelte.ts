import type { ProjectApi, TransferTableView } from '$lib/api';
import { SIMULATED_PROPERTIES, type SimulatedProperty } from '$lib/properties';
import { TRANSFER_RELATIONS, TRANSFER_RELATION_KEYS, type TransferRelation } from '$lib/schemas/exports';

/**
 * Points typed or pasted as lines of "input, output" (comma, semicolon, tab or spaces between; a header line and
 * blank lines skipped), as a lookup table takes them. Returns the points and the lines that did not read.
 */
export function parsePoints(text: string): { points: [number, number][]; bad: number[] } {
	const points: [number, number][] = [];
	const bad: number[] = [];
	text.split(/\r\n|\n|\r/).forEach((line, i) => {
		const t = line.trim();
		if (t === '') return;
		const parts = t.split(/[,;\t ]+/).filter((p) => p !== '');
		const a = Number(parts[0]);
		const b = Number(parts[1]);
		if (parts.length >= 2 && Number.isFinite(a) && Number.isFinite(b)) points.push([a, b]);
		else if (!(i === 0 && points.length === 0)) bad.push(i + 1);
	});
	return { points, bad };
}

/** The newest version of each table name. */
export function newestTables(tables: readonly TransferTableView[]): TransferTableView[] {
	const out = new Map<string, TransferTableView>();
	for (const t of tables) if (!out.has(t.name) || out.get(t.name)!.version < t.version) out.set(t.name, t);
	return [...out.values()];
}

/** The forms of the transfer panel: a new lookup table, and a new transfer set (per property: relations and tables). */
export class TransferForms {
	table = $state({ name: '', input: 'qc1Ncs' as SimulatedProperty, output: '', outputUnit: '', monotonic: 'increasing' as 'increasing' | 'decreasing' | 'none', text: '' });
	setName = $state('');
	/** Per property: the relations and table ids chosen. */
	chosen = $state<Record<string, { relations: TransferRelation[]; tables: string[] }>>(
		Object.fromEntries(SIMULATED_PROPERTIES.map((p) => [p, { relations: [] as TransferRelation[], tables: [] as string[] }]))
	);
	busy = $state(false);
	problem = $state('');
	saved = $state('');

	constructor(
		private readonly api: ProjectApi,
		private readonly onSaved: () => Promise<void>
	) {}

	readonly points = $derived(parsePoints(this.table.text));

	/** The relations that read a property. */
	relationsOf(p: SimulatedProperty): TransferRelation[] {
		return TRANSFER_RELATION_KEYS.filter((k) => TRANSFER_RELATIONS[k].input === p);
	}

	async saveTable(): Promise<void> {
		await this.attempt(async () => {
			const t = this.table;
			const saved = await this.api.saveTransferTable({ name: t.name, input: t.input, output: t.output, outputUnit: t.outputUnit || '–', monotonic: t.monotonic, points: this.points.points });
			this.saved = `Saved ${saved.name}, version ${saved.version}.`;
		});
	}

	async saveSet(): Promise<void> {
		await this.attempt(async () => {
			const rules = Object.entries(this.chosen)
				.filter(([, c]) => c.relations.length + c.tables.length > 0)
				.map(([property, c]) => ({ property: property as SimulatedProperty, domain: null, outputs: [...c.relations.map((relation) => ({ relation })), ...c.tables.map((tableId) => ({ tableId }))] }));
			const saved = await this.api.saveTransferSet({ name: this.setName, rules });
			this.saved = `Saved the transfer set ${saved.name}, version ${saved.version}.`;
		});
	}

	private async attempt(fn: () => Promise<void>): Promise<void> {
		this.busy = true;
		this.problem = '';
		this.saved = '';
		try {
			await fn();
			await this.onSaved();
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.busy = false;
		}
	}
}
