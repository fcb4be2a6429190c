// Pure helpers of the Compare page: whether recipes share a grid, where zonations split a unit differently,
// and each domain's figures over the ensemble maps.
import type { Recipe } from '$lib/geostat';
import { weightedMean, weightedQuantiles } from '$lib/geostat';
import type { ZonationView, ZoneBoundaryView } from '$lib/api';

/** A recipe named for messages. */
export interface Named {
	name: string;
	recipe: Recipe;
}

function gridText(r: Recipe, unit: string): string {
	const t = r.targets;
	if (t.kind !== 'grid') return `${t.kind} targets`;
	const cells = t.counts.y > 1 ? `${t.counts.x} × ${t.counts.y} × ${t.counts.z}` : `${t.counts.x} × ${t.counts.z}`;
	const size = t.counts.y > 1 ? `${t.spacing.x} × ${t.spacing.y} × ${t.spacing.z}` : `${t.spacing.x} × ${t.spacing.z}`;
	return `${cells} cells of ${size} ${unit} from (${t.origin.x}, ${t.origin.y}, ${t.origin.z})`;
}

/**
 * Why recipes cannot be compared cell by cell, or null when they can: each must be on a regular grid with the
 * same origin, cell sizes and counts as the first (then every cell is the same place in each).
 */
export function gridRefusal(recipes: Named[], unit: string): string | null {
	if (recipes.length < 2) return null;
	const [first, ...rest] = recipes;
	const key = (r: Recipe) => (r.targets.kind === 'grid' ? JSON.stringify([r.targets.origin, r.targets.spacing, r.targets.counts]) : null);
	for (const r of recipes) {
		if (key(r.recipe) === null) return `${r.name} is not on a regular grid; recipes are compared cell by cell on one grid.`;
	}
	const other = rest.find((r) => key(r.recipe) !== key(first.recipe));
	if (!other) return null;
	return `${first.name} is on a grid of ${gridText(first.recipe, unit)}; ${other.name} on ${gridText(other.recipe, unit)}. Recipes compared cell by cell must share a grid: make one again on the other’s grid (“Change as a new recipe”).`;
}

/**
 * The zone boundaries of units that the zonations split differently: a unit is split by a zonation when its
 * zones fall in more than one of the zonation's domains. A boundary is returned when some of the zonations split
 * its unit and others do not. Zonations not found (deleted) are left out.
 */
export function boundariesWhereZonationsDiffer(zonations: (ZonationView | undefined)[], boundaries: ZoneBoundaryView[]): ZoneBoundaryView[] {
	const known = zonations.filter((z): z is ZonationView => z !== undefined);
	if (known.length < 2) return [];
	const split = (z: ZonationView, unitId: string) => new Set(z.domains.filter((d) => d.members.some((m) => m.unitId === unitId)).map((d) => d.id)).size > 1;
	return boundaries.filter((b) => new Set(known.map((z) => split(z, b.unitId))).size > 1);
}

/** One domain of one recipe over the ensemble maps. */
export interface DomainFigures {
	domain: number;
	cells: number;
	/** The conditioning data: how many, their declustered mean and P50. */
	data: { n: number; mean: number; p50: number };
	/** Means over the domain's cells of the E-type, of the ensemble SD, and of P(below) when it is given. */
	etype: number;
	sd: number;
	below: number | null;
}

/** Each domain's figures of a recipe over its E-type, SD and (optionally) P(below) maps. */
export function domainFigures(recipe: Recipe, domainOf: Int32Array, maps: { mean: ArrayLike<number>; sd: ArrayLike<number>; below?: ArrayLike<number> | null }): DomainFigures[] {
	return recipe.input.domains.map((d, k) => {
		let n = 0;
		let e = 0;
		let s = 0;
		let b = 0;
		for (let c = 0; c < domainOf.length; c++) {
			if (domainOf[c] !== k) continue;
			n++;
			e += maps.mean[c];
			s += maps.sd[c];
			if (maps.below) b += maps.below[c];
		}
		const values = d.samples.map((x) => x.value);
		const weights = 'weights' in d && d.weights ? d.weights : undefined;
		return {
			domain: k,
			cells: n,
			data: { n: values.length, mean: values.length ? weightedMean(values, weights) : NaN, p50: values.length ? weightedQuantiles(values, weights, [0.5])[0] : NaN },
			etype: n ? e / n : NaN,
			sd: n ? s / n : NaN,
			below: maps.below ? (n ? b / n : NaN) : null
		};
	});
}

/** `b − a` cell by cell, NaN where either is NaN. */
export function difference(a: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
	const out = new Float64Array(a.length);
	for (let i = 0; i < a.length; i++) out[i] = b[i] - a[i];
	return out;
}

/** The largest |value| over the cells `keep` says, for a diverging scale centred on zero (1 when all are 0). */
export function symmetricSpan(values: ArrayLike<number>, keep: (cell: number) => boolean): number {
	let m = 0;
	for (let i = 0; i < values.length; i++) if (keep(i) && Number.isFinite(values[i]) && Math.abs(values[i]) > m) m = Math.abs(values[i]);
	return m > 0 ? m : 1;
}
