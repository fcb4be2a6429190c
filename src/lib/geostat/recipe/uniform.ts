import { ENGINE_VERSION } from './engine-version';
import { recipeSchema } from './schema';
import type { TargetDefinition, UniformRecipe } from './schema';
import { targetsFromDefinition } from './targets-from-definition';
import { weightedQuantiles } from '../statistics/weighted';
import type { Sample } from '../types';

/** One domain of a uniform recipe as its builder gives it: the conditioning data and declustering weights. */
export interface UniformDomainData {
	samples: Sample[];
	/** Declustering weights, one per sample (positive; normalised here). */
	weights: number[];
}

/**
 * The value a uniform field takes in a domain at each percentile: the declustered percentile of the domain's
 * data, `weightedQuantiles(values, weights, p / 100)` — linear between the weighted plotting positions
 * (p = (cumulative weight below + ½ own weight) / total; Hyndman & Fan 1996 definition 5 with equal weights),
 * the smallest / largest datum outside them. These are the positions the domain statistics use, so the P50 a
 * domain page shows is the value a P50 uniform field holds. Arithmetic only: the same bits everywhere.
 * A uniform baseline per stratum at a declustered percentile, the median by default, with sensitivity
 * studies varying the percentile, is common practice.
 * @throws {RangeError} on no data, a percentile outside (0, 100), and as weightedQuantiles
 */
export function uniformValues(values: ArrayLike<number>, weights: ArrayLike<number>, percentiles: ArrayLike<number>): number[] {
	if (values.length === 0) throw new RangeError('a uniform domain needs data');
	const ps: number[] = [];
	for (let k = 0; k < percentiles.length; k++) {
		const p = percentiles[k];
		if (!(p > 0 && p < 100)) throw new RangeError('percentiles must lie between 0 and 100');
		ps.push(p / 100);
	}
	return Array.from(weightedQuantiles(values, weights, ps));
}

/**
 * Builds a uniform recipe (kind 'uniform', one realization per percentile, realization r at percentiles[r]) from
 * each domain's data and weights and the targets' definition: each domain records its data, weights and the
 * resolved values (uniformValues), stamped with ENGINE_VERSION and validated by recipeSchema. Inputs are not mutated.
 * @throws {RangeError} as uniformValues, or listing the schema's issues
 */
export function createUniformRecipe(percentiles: number[], domains: UniformDomainData[], targets: TargetDefinition): UniformRecipe {
	const raw = {
		engineVersion: ENGINE_VERSION,
		kind: 'uniform',
		realizations: percentiles.length,
		input: {
			percentiles: [...percentiles],
			domains: domains.map((d) => ({
				samples: d.samples.map((s) => ({ ...s })),
				weights: [...d.weights],
				values: uniformValues(
					d.samples.map((s) => s.value),
					d.weights,
					percentiles
				)
			}))
		},
		targets
	};
	const parsed = recipeSchema.safeParse(JSON.parse(JSON.stringify(raw)));
	if (!parsed.success) {
		throw new RangeError(`invalid recipe: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
	}
	return parsed.data as UniformRecipe;
}

/**
 * A uniform recipe made ready to realize: checks that each domain's recorded values are its data's declustered
 * percentiles (uniformValues, bit for bit), so a recipe whose values were edited by hand is refused, and expands
 * the targets' domains once. Realization r fills each target with its domain's value at percentiles[r] (NaN
 * where a target has no domain).
 * @throws {RangeError} 'uniform values of domain k do not match its data' when a recorded value differs
 */
export function prepareUniform(recipe: UniformRecipe): { active: number; realize(realization: number): Float64Array } {
	const { percentiles, domains } = recipe.input;
	domains.forEach((d, k) => {
		const expected = uniformValues(
			d.samples.map((s) => s.value),
			d.weights,
			percentiles
		);
		if (expected.some((v, r) => v !== d.values[r])) throw new RangeError(`uniform values of domain ${k} do not match its data`);
	});
	const domain = targetsFromDefinition(recipe.targets).domain;
	let active = 0;
	for (let i = 0; i < domain.length; i++) if (domain[i] >= 0) active++;
	return {
		active,
		realize(realization) {
			const out = new Float64Array(domain.length);
			const values = domains.map((d) => d.values[realization]);
			for (let i = 0; i < domain.length; i++) out[i] = domain[i] >= 0 ? values[domain[i]] : NaN;
			return out;
		}
	};
}
