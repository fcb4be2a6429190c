import {
	COINCIDENCE_TOLERANCE,
	compileVariogram,
	normalScore,
	recipeInput,
	targetsFromDefinition,
	weightedMean,
	weightedQuantiles,
	weightedVariance,
	type Recipe,
	type VariogramModel
} from '../geostat';
import { ensembleMap } from './ensemble-map';
import { gridVariogram } from './grid-variogram';
import { ksDistance } from './ks-distance';

/** How a check looks: as expected, worth a look, or off. */
export type CheckLevel = 'ok' | 'watch' | 'off';

export interface CheckVerdict {
	level: CheckLevel;
	/** Plain words: what was seen and, when it is not ok, what usually causes it. */
	message: string;
}

/** Data reproduction: the cells that hold conditioning data against the data. */
export interface DataCheck {
	/** Data of the domain. */
	data: number;
	/** Data whose cell belongs to the domain (the others fall in another domain's or an unsimulated cell). */
	inCells: number;
	/** Data within COINCIDENCE_TOLERANCE of a cell centre, and the largest |value − datum| there (0 when honoured). */
	coincident: number;
	coincidentMaxError: number;
	/** Correlation between the data and the E-type of their cells (NaN with fewer than 3 such data). */
	etypeCorrelation: number;
	/** Mean of E-type − datum over those cells, in the property's unit. */
	etypeBias: number;
	/** Declustered standard deviation of the data, the yardstick of the differences. */
	dataSd: number;
	/** Datum and E-type of its cell, for a scatter plot. */
	pairs: { datum: number; etype: number }[];
	verdict: CheckVerdict;
}

/** Histogram reproduction: each realization's CDF in the domain against the declustered data CDF. */
export interface HistogramCheck {
	/** Kolmogorov–Smirnov distance of each realization checked, in realization order. */
	ks: number[];
	worst: number;
	median: number;
	/** The data's declustered quantiles and each realization's, at `probabilities`, for plotting CDFs. */
	probabilities: number[];
	data: number[];
	realizations: number[][];
	verdict: CheckVerdict;
}

/** One direction of variogram reproduction: the realizations' mean, min and max against the model, lag by lag. */
export interface VariogramCheckDirection {
	direction: 'vertical' | 'x' | 'y';
	lags: { h: number; model: number; mean: number; min: number; max: number; pairs: number }[];
}

export interface VariogramCheck {
	/** What the variograms are of: the realizations' normal scores, or their values (transform 'none'). */
	of: 'normal scores' | 'values';
	sill: number;
	directions: VariogramCheckDirection[];
	verdict: CheckVerdict;
}

export interface DomainCheck {
	domain: number;
	cells: number;
	realizations: number;
	data: DataCheck;
	histogram: HistogramCheck;
	/** Null for explicit target points (variograms are checked on grids). */
	variogram: VariogramCheck | null;
}

export interface CheckOptions {
	/** Realizations whose variograms are computed (the first ones given); default 20. */
	variogramRealizations?: number;
	/** Most lags per direction; default 16. */
	maxLags?: number;
}

const PROBABILITIES = Array.from({ length: 49 }, (_, k) => (k + 1) / 50);

/**
 * Checks of a recipe's realizations, domain by domain (Deutsch & Journel 1998, ch. V; Leuangthong, McLennan &
 * Deutsch 2004, "Minimum acceptance criteria for geostatistical realizations"; Goovaerts 1997, ch. 8):
 * data reproduction (the cells holding data, against the data), histogram reproduction (KS distance of each
 * realization's distribution in the domain from the declustered data distribution) and variogram reproduction
 * (vertical and horizontal variograms of the realizations' normal scores — each realization's own normal-score
 * transform in the domain — or of their values for transform 'none', against the model). Realizations are
 * given in realization order and must all be of this recipe. Every verdict says in plain words what usually
 * causes a departure. Ergodic fluctuations make single realizations depart from the model by an amount that
 * grows with the range relative to the domain (Deutsch & Journel 1998; Goovaerts 1997), so the verdicts read
 * medians and means over the realizations, with tolerances stated in each message.
 * Does not mutate its inputs.
 * A uniform recipe has none of these (checkUniform checks it).
 * @throws {RangeError} with no realizations, one whose length differs from the recipe's targets, or a uniform recipe
 */
export function checkRealizations(recipe: Recipe, realizations: Float64Array[], opts: CheckOptions = {}): DomainCheck[] {
	const { variogramRealizations = 20, maxLags = 16 } = opts;
	if (recipe.kind === 'uniform') throw new RangeError('a uniform recipe is checked by checkUniform');
	if (realizations.length === 0) throw new RangeError('no realizations');
	const targets = targetsFromDefinition(recipe.targets);
	const n = targets.domain.length;
	for (const r of realizations) if (r.length !== n) throw new RangeError('realization and targets differ in length');
	const input = recipeInput(recipe);
	const etype = ensembleMap(realizations, 'mean');
	return input.domains.map((d, index) => {
		const cells: number[] = [];
		for (let i = 0; i < n; i++) if (targets.domain[i] === index) cells.push(i);
		const values = d.samples.map((s) => s.value);
		const weights = d.weights;
		return {
			domain: index,
			cells: cells.length,
			realizations: realizations.length,
			data: dataCheck(recipe, targets, index, d.samples, weights, realizations, etype),
			histogram: histogramCheck(realizations, cells, values, weights),
			variogram:
				recipe.targets.kind === 'grid' && cells.length > 1
					? variogramCheck(recipe, index, d.model, d.transform, realizations.slice(0, variogramRealizations), maxLags)
					: null
		};
	});
}

function dataCheck(
	recipe: Recipe,
	targets: ReturnType<typeof targetsFromDefinition>,
	index: number,
	samples: { x: number; y: number; z: number; value: number }[],
	weights: number[] | undefined,
	realizations: Float64Array[],
	etype: Float64Array
): DataCheck {
	const values = samples.map((s) => s.value);
	const dataSd = values.length ? Math.sqrt(weightedVariance(values, weights)) : NaN;
	const pairs: { datum: number; etype: number }[] = [];
	let coincident = 0;
	let coincidentMaxError = 0;
	const def = recipe.targets;
	if (def.kind !== 'points') {
		// The cell each datum falls in: by arithmetic on a regular grid, by the nearest listed centre on a rectilinear one.
		const counts = def.kind === 'grid' ? def.counts : { x: def.x.length, y: def.y.length, z: def.z.length };
		const cellOf =
			def.kind === 'grid'
				? (s: { x: number; y: number; z: number }) => [
						Math.round((s.x - def.origin.x) / def.spacing.x),
						Math.round((s.y - def.origin.y) / def.spacing.y),
						Math.round((s.z - def.origin.z) / def.spacing.z)
					]
				: (s: { x: number; y: number; z: number }) => [nearest(def.x, s.x), nearest(def.y, s.y), nearest(def.z, s.z)];
		for (const s of samples) {
			const [i, j, k] = cellOf(s);
			if (i < 0 || j < 0 || k < 0 || i >= counts.x || j >= counts.y || k >= counts.z) continue;
			const g = i + counts.x * (j + counts.y * k);
			if (targets.domain[g] !== index) continue;
			pairs.push({ datum: s.value, etype: etype[g] });
			if (Math.abs(targets.x[g] - s.x) <= COINCIDENCE_TOLERANCE && Math.abs(targets.y[g] - s.y) <= COINCIDENCE_TOLERANCE && Math.abs(targets.z[g] - s.z) <= COINCIDENCE_TOLERANCE) {
				coincident++;
				for (const r of realizations) coincidentMaxError = Math.max(coincidentMaxError, Math.abs(r[g] - s.value));
			}
		}
	}
	const r = correlation(pairs.map((p) => p.datum), pairs.map((p) => p.etype));
	const bias = pairs.length ? pairs.reduce((a, p) => a + (p.etype - p.datum), 0) / pairs.length : NaN;
	const outside = samples.length - pairs.length;
	let verdict: CheckVerdict;
	if (samples.length === 0) verdict = { level: 'ok', message: 'No conditioning data: an unconditional field.' };
	else if (pairs.length < 3) {
		verdict = {
			level: 'watch',
			message: `Only ${pairs.length} of ${samples.length} data fall in cells of this domain, too few to compare. The grid's contacts differ from the soundings' (cells taller than the unit), or the grid does not cover the data.`
		};
	} else {
		const level: CheckLevel = coincidentMaxError > 1e-9 * Math.max(1, dataSd) ? 'off' : r >= 0.8 && outside <= 0.1 * samples.length ? 'ok' : r >= 0.6 ? 'watch' : 'off';
		const parts = [
			`The E-type of the ${pairs.length} cells holding data follows the data with correlation ${r.toFixed(2)} (expected ≥ 0.8) and a mean difference of ${fmt(bias)} (${fmt(Math.abs(bias) / dataSd, 2)} of the data's spread).`
		];
		if (coincident) parts.push(`${coincident} data sit on cell centres and are ${coincidentMaxError === 0 ? 'reproduced exactly' : `off by up to ${fmt(coincidentMaxError)}`}.`);
		if (outside > 0.1 * samples.length) parts.push(`${outside} of ${samples.length} data fall outside the domain's cells: the grid's contacts differ from the soundings' there (cells taller than the unit).`);
		if (level !== 'ok') {
			parts.push('Usually a nugget effect in the model, cells coarser than the data spacing, or a search that keeps too few data from each sounding.');
		}
		verdict = { level, message: parts.join(' ') };
	}
	return {
		data: samples.length,
		inCells: pairs.length,
		coincident,
		coincidentMaxError,
		etypeCorrelation: r,
		etypeBias: bias,
		dataSd,
		pairs,
		verdict
	};
}

function histogramCheck(realizations: Float64Array[], cells: number[], values: number[], weights: number[] | undefined): HistogramCheck {
	const empty = { ks: [], worst: NaN, median: NaN, probabilities: PROBABILITIES, data: [], realizations: [] };
	if (cells.length === 0) return { ...empty, verdict: { level: 'watch', message: 'No cell of the grid lies in this domain.' } };
	if (values.length === 0) return { ...empty, verdict: { level: 'ok', message: 'No data to compare the histogram with.' } };
	const ks: number[] = [];
	const quantiles: number[][] = [];
	const v = new Float64Array(cells.length);
	for (const r of realizations) {
		for (let c = 0; c < cells.length; c++) v[c] = r[cells[c]];
		ks.push(ksDistance(v, values, weights));
		if (quantiles.length < 20) quantiles.push(Array.from(weightedQuantiles(v, undefined, PROBABILITIES)));
	}
	const sorted = [...ks].sort((a, b) => a - b);
	const median = sorted.length % 2 ? sorted[sorted.length >> 1] : (sorted[sorted.length / 2 - 1] + sorted[sorted.length / 2]) / 2;
	const worst = sorted[sorted.length - 1];
	// Tolerances of our own, read against the ergodic fluctuations of the demo's realizations (tests/ensemble).
	const level: CheckLevel = median <= 0.1 ? 'ok' : median <= 0.2 ? 'watch' : 'off';
	const words = `Each realization's distribution in the domain lies within a KS distance of ${median.toFixed(3)} (median) and ${worst.toFixed(3)} (worst of ${ks.length}) of the declustered data's (median up to 0.10 is as expected, up to 0.20 worth a look).`;
	const causes =
		level === 'ok'
			? ''
			: ' Usually ergodic fluctuations (a range long compared with the domain: look at the median over more realizations), declustering weights that do not suit the data, or tail bounds far beyond the data.';
	return {
		ks,
		worst,
		median,
		probabilities: PROBABILITIES,
		data: Array.from(weightedQuantiles(values, weights, PROBABILITIES)),
		realizations: quantiles,
		verdict: { level, message: words + causes }
	};
}

function variogramCheck(
	recipe: Recipe,
	index: number,
	model: VariogramModel,
	transform: 'normal-score' | 'none',
	realizations: Float64Array[],
	maxLags: number
): VariogramCheck {
	const def = recipe.targets;
	if (def.kind !== 'grid') throw new RangeError('variograms are checked on grids');
	const { counts, spacing } = def;
	const targets = targetsFromDefinition(def);
	const n = targets.domain.length;
	const mask = new Uint8Array(n);
	const cells: number[] = [];
	for (let i = 0; i < n; i++) if (targets.domain[i] === index) {
		mask[i] = 1;
		cells.push(i);
	}
	const cv = compileVariogram(model);
	const of = transform === 'normal-score' ? 'normal scores' : 'values';
	const structures = model.structures.filter((s) => s.type !== 'nugget');
	const longest = (key: 'rangeMajor' | 'rangeMinor' | 'rangeVertical') => Math.max(0, ...structures.map((s) => (Number.isFinite(s[key]) ? s[key] : 0)));
	const axes: { direction: 'vertical' | 'x' | 'y'; axis: 'x' | 'y' | 'z'; range: number; along: number }[] = [
		{ direction: 'vertical', axis: 'z', range: longest('rangeVertical'), along: counts.z },
		{ direction: 'x', axis: 'x', range: Math.max(longest('rangeMajor'), longest('rangeMinor')), along: counts.x },
		{ direction: 'y', axis: 'y', range: Math.max(longest('rangeMajor'), longest('rangeMinor')), along: counts.y }
	];
	const field = new Float64Array(n);
	const directions: VariogramCheckDirection[] = [];
	const sums = new Map<string, { gamma: number[][]; pairs: number[] }>();
	const used = axes.filter((a) => a.along > 1);
	const stepsOf = new Map<string, number[]>();
	for (const a of used) {
		const reach = Math.min(a.along - 1, Math.max(2, Math.ceil((1.5 * (a.range || spacing[a.axis] * 4)) / spacing[a.axis])));
		const stride = Math.max(1, Math.ceil(reach / maxLags));
		const steps: number[] = [];
		for (let s = stride; s <= reach; s += stride) steps.push(s);
		stepsOf.set(a.direction, steps);
		sums.set(a.direction, { gamma: steps.map(() => []), pairs: steps.map(() => 0) });
	}
	for (const r of realizations) {
		const vals = cells.map((c) => r[c]);
		const scored = transform === 'normal-score' ? normalScore(vals).scores : Float64Array.from(vals);
		cells.forEach((c, k) => (field[c] = scored[k]));
		for (const a of used) {
			const lags = gridVariogram(field, mask, counts, spacing, a.axis, stepsOf.get(a.direction)!);
			const acc = sums.get(a.direction)!;
			lags.forEach((l, k) => {
				if (l.pairs > 0) acc.gamma[k].push(l.gamma);
				acc.pairs[k] = l.pairs;
			});
		}
	}
	let deviation = 0;
	let counted = 0;
	for (const a of used) {
		const steps = stepsOf.get(a.direction)!;
		const acc = sums.get(a.direction)!;
		const lags = steps.map((s, k) => {
			const h = s * spacing[a.axis];
			const m = a.axis === 'z' ? cv.gamma(0, 0, h) : a.axis === 'x' ? cv.gamma(h, 0, 0) : cv.gamma(0, h, 0);
			const g = acc.gamma[k];
			const mean = g.length ? g.reduce((p, q) => p + q, 0) / g.length : NaN;
			if (g.length && h <= (a.range || Infinity) && cv.sill > 0) {
				deviation += Math.abs(mean - m) / cv.sill;
				counted++;
			}
			return { h, model: m, mean, min: g.length ? Math.min(...g) : NaN, max: g.length ? Math.max(...g) : NaN, pairs: acc.pairs[k] };
		});
		directions.push({ direction: a.direction, lags });
	}
	const dev = counted ? deviation / counted : NaN;
	const level: CheckLevel = !Number.isFinite(dev) ? 'watch' : dev <= 0.15 ? 'ok' : dev <= 0.3 ? 'watch' : 'off';
	const parts: string[] = [];
	if (Number.isFinite(dev)) {
		parts.push(`Within the ranges, the realizations' mean variogram of ${of} lies ${(dev * 100).toFixed(0)} % of the sill from the model on average (up to 15 % is as expected, up to 30 % worth a look).`);
	} else parts.push('Too few cells in this domain to pair at the model’s ranges.');
	if (transform === 'normal-score' && Math.abs(cv.sill - 1) > 0.1) {
		parts.push(`The model's total sill is ${fmt(cv.sill, 3)}, not 1, the variance of normal scores: the realizations cannot follow it at long lags.`);
	}
	if (level !== 'ok') parts.push('Usually too few realizations, a search too small to carry the correlation (raise the simulated nodes or the radius), a sill that is not the variance, or a domain small compared with the range.');
	return { of, sill: cv.sill, directions, verdict: { level: transform === 'normal-score' && Math.abs(cv.sill - 1) > 0.1 && level === 'ok' ? 'watch' : level, message: parts.join(' ') } };
}

function correlation(a: number[], b: number[]): number {
	if (a.length < 3) return NaN;
	const ma = weightedMean(a);
	const mb = weightedMean(b);
	let sab = 0;
	let saa = 0;
	let sbb = 0;
	for (let i = 0; i < a.length; i++) {
		sab += (a[i] - ma) * (b[i] - mb);
		saa += (a[i] - ma) * (a[i] - ma);
		sbb += (b[i] - mb) * (b[i] - mb);
	}
	return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : NaN;
}

function fmt(v: number, digits = 3): string {
	return Number.isFinite(v) ? String(Number(v.toPrecision(digits))) : '—';
}

/** Index of the centre nearest v in an ascending list, −1 beyond half a cell past either end. */
function nearest(centres: number[], v: number): number {
	let lo = 0;
	let hi = centres.length - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (centres[mid] <= v) lo = mid;
		else hi = mid;
	}
	const k = Math.abs(centres[hi] - v) < Math.abs(centres[lo] - v) ? hi : lo;
	const half = centres.length > 1 ? Math.abs(centres[Math.min(k + 1, centres.length - 1)] - centres[Math.max(k - 1, 0)]) / (k === 0 || k === centres.length - 1 ? 1 : 2) : Infinity;
	return Math.abs(centres[k] - v) <= half / 2 + 1e-9 || centres.length === 1 ? k : -1;
}
