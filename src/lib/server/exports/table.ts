/**
 * What an exported file holds, row by row: the targets (grid cells or mesh elements) with their coordinates and
 * domain, a column per simulated property, and the parameters a transfer set carries each domain's property to.
 * Shared by the CSV, VTK and ZIP writers, so every format holds the same numbers.
 */
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';
import { crrBI2014, lookUp, relativeDensityIB2008 } from '$lib/cpt';
import { TRANSFER_RELATIONS, type TransferRelation } from '$lib/schemas/exports';
import type { ElementGroups, ElementIds } from './element-ids';
import type { ResolvedTransferSet, TransferTableView } from '$lib/server/services/transfers';

/** A simulated domain of the recipe. */
export interface ExportDomain {
	index: number;
	name: string;
	property: SimulatedProperty;
}

/** The targets of a recipe, as files list them. */
export interface ExportTargets {
	kind: 'grid' | 'mesh';
	geometry: '2d' | '3d';
	lengthUnit: 'm' | 'ft';
	x: ArrayLike<number>;
	y: ArrayLike<number>;
	z: ArrayLike<number>;
	/** Domain index of each target (−1: not simulated). */
	domain: ArrayLike<number>;
	/** A grid's cell counts and cell edges along each axis (2D: y is [0]); null for a mesh. */
	grid: { counts: { x: number; y: number; z: number }; edges: { x: number[]; y: number[]; z: number[] } } | null;
	/** A mesh's element ids and groups. */
	ids: ElementIds | null;
	group: ElementGroups | null;
}

/** A column of model parameters a transfer writes, with what it counts of values held at a table's ends. */
export interface OutputColumn {
	header: string;
	unit: string;
	/** Where its values come from, for the manifest. */
	source: string;
	relation?: TransferRelation;
	table?: TransferTableView;
	/** Values (elements × realizations) below the first point and above the last of a table, held at the end. */
	held: { below: number; above: number };
}

/** How the values of one domain become its outputs: per output column, the function of (value, target). */
export type DomainTransfer = { column: number; of: (value: number, target: number) => number }[];

/** A column header with its unit, ASCII only (every model program's CSV reader takes it): "su (kPa)", "qc1Ncs". */
export function headerOf(name: string, unit: string): string {
	return unit === '–' || unit === '' ? name : `${name} (${unit})`;
}

/** The properties of the simulated domains, in the order of the domains' indices. */
export function propertiesOf(domains: readonly ExportDomain[]): SimulatedProperty[] {
	return [...new Set([...domains].sort((a, b) => a.index - b.index).map((d) => d.property))];
}

/**
 * The output columns and each domain's transfers under a transfer set (none without one): a domain takes the rule
 * naming it, else the rule for its property. `sigmaVeff(target)` gives σ′v at a target for su = su/σ′v × σ′v.
 */
export function planTransfers(
	set: ResolvedTransferSet | null,
	domains: readonly ExportDomain[],
	sigmaVeff: (target: number) => number,
	taken: ReadonlySet<string>
): { outputs: OutputColumn[]; perDomain: DomainTransfer[] } {
	const outputs: OutputColumn[] = [];
	const perDomain: DomainTransfer[] = [];
	if (!set) return { outputs, perDomain: domains.map(() => []) };
	const tables = new Map(set.tables.map((t) => [t.id, t]));
	const columnFor = (name: string, unit: string, make: () => Omit<OutputColumn, 'header' | 'unit' | 'held'>): number => {
		let header = headerOf(name, unit);
		while (taken.has(header)) header = headerOf(`${name}_t`, unit);
		const k = outputs.findIndex((o) => o.header === header);
		if (k >= 0) return k;
		outputs.push({ header, unit, held: { below: 0, above: 0 }, ...make() });
		return outputs.length - 1;
	};
	for (const d of [...domains].sort((a, b) => a.index - b.index)) {
		const rule = set.rules.find((r) => r.property === d.property && r.domain === d.name) ?? set.rules.find((r) => r.property === d.property && r.domain === null);
		const list: DomainTransfer = [];
		for (const o of rule?.outputs ?? []) {
			if ('relation' in o) {
				const rel = TRANSFER_RELATIONS[o.relation];
				if (rel.input !== d.property) continue;
				const column = columnFor(rel.column, rel.unit, () => ({ source: `${rel.label}: ${rel.source}`, relation: o.relation }));
				const out = outputs[column];
				const [lo, hi] = rel.range;
				// Inputs beyond the relation's range are held at its ends and counted, as a table's are.
				const held = (v: number) => {
					if (v < lo) {
						out.held.below++;
						return lo;
					}
					if (v > hi) {
						out.held.above++;
						return hi;
					}
					return v;
				};
				const of =
					o.relation === 'dr-ib2008'
						? (v: number) => relativeDensityIB2008(held(v))
						: o.relation === 'crr-bi2014'
							? (v: number) => crrBI2014(held(v))
							: (v: number, t: number) => v * sigmaVeff(t);
				list.push({ column, of });
			} else {
				const table = tables.get(o.tableId);
				if (!table || table.input !== d.property) continue;
				const column = columnFor(table.output, table.outputUnit, () => ({
					source: `table ${table.name}, version ${table.version} (${PROPERTY_INFO[table.input].label} → ${table.output}, ${table.points.length} points, piecewise linear, held at its ends)`,
					table
				}));
				const out = outputs[column];
				list.push({
					column,
					of: (v: number) => {
						const r = lookUp(table, v);
						if (r.held < 0) out.held.below++;
						else if (r.held > 0) out.held.above++;
						return r.value;
					}
				});
			}
		}
		perDomain[d.index] = list;
	}
	for (let i = 0; i < perDomain.length; i++) perDomain[i] ??= [];
	return { outputs, perDomain };
}

/** One column of a row: its header and how a row's cell is read. */
export interface RowColumns {
	headers: string[];
	/** Columns holding numbers taken as they are (coordinates); the rest are text or values. */
	coordinates: number;
}

/**
 * The leading columns of a row (what the target is and where): cell and its indices for a grid, element id and
 * group for a mesh; the coordinates; the domain.
 */
export function leadingHeaders(t: ExportTargets): string[] {
	const u = t.lengthUnit;
	const where = t.geometry === '2d' ? [`chainage (${u})`, `elevation (${u})`] : [`easting (${u})`, `northing (${u})`, `elevation (${u})`];
	if (t.kind === 'grid') return ['cell', 'i', ...(t.geometry === '3d' ? ['j'] : []), 'k', ...where, 'domain'];
	return ['element', ...where, ...(t.group ? ['group'] : []), 'domain'];
}
