import { targetsFromDefinition, uniformValues, type UniformRecipe } from '../geostat';
import type { CheckVerdict } from './domain-checks';

/** One domain of a uniform recipe checked: its values against its data's declustered percentiles and its cells. */
export interface UniformCheck {
	domain: number;
	cells: number;
	/** The recipe's percentiles, realization by realization. */
	percentiles: number[];
	/** The values the recipe records, one a percentile. */
	values: number[];
	/** The declustered percentiles of the domain's data, computed again here (uniformValues). */
	recomputed: number[];
	/** Cells, over the realizations checked, whose value is not the domain's value of that realization. */
	offCells: number;
	verdict: CheckVerdict;
}

/**
 * What can be checked of a uniform recipe's realizations, domain by domain: that each domain's value is the
 * declustered percentile of its data (recomputed with uniformValues, the same weighted plotting positions as the
 * domain statistics) and that every cell of the domain holds it in each realization. Data, histogram and
 * variogram reproduction do not apply: a uniform field honours no single datum, has one value a domain and no
 * spatial variation, by design. `realizations` are given by realization number (a map, or an array in order);
 * those missing are not checked. Does not mutate its inputs.
 * @throws {RangeError} when a realization's length differs from the recipe's targets
 */
export function checkUniform(recipe: UniformRecipe, realizations: ReadonlyMap<number, Float64Array> | Float64Array[]): UniformCheck[] {
	const domain = targetsFromDefinition(recipe.targets).domain;
	const list: [number, Float64Array][] = realizations instanceof Map ? [...realizations] : (realizations as Float64Array[]).map((v, r) => [r, v]);
	for (const [, v] of list) if (v.length !== domain.length) throw new RangeError('realization and targets differ in length');
	const { percentiles, domains } = recipe.input;
	return domains.map((d, k) => {
		const recomputed = uniformValues(
			d.samples.map((s) => s.value),
			d.weights,
			percentiles
		);
		let cells = 0;
		for (let i = 0; i < domain.length; i++) if (domain[i] === k) cells++;
		let offCells = 0;
		for (const [r, v] of list) for (let i = 0; i < domain.length; i++) if (domain[i] === k && v[i] !== d.values[r]) offCells++;
		const mismatch = recomputed.some((v, r) => v !== d.values[r]);
		const verdict: CheckVerdict =
			mismatch || offCells > 0
				? {
						level: 'off',
						message: mismatch
							? 'The recorded values are not the declustered percentiles of the domain’s data: the recipe was changed after it was made.'
							: `${offCells} cell values differ from the domain’s value: the realizations are not this recipe’s.`
					}
				: {
						level: 'ok',
						message: `Every cell holds the declustered P${percentiles.join(', P')} of the domain’s ${d.samples.length} data, as recorded.`
					};
		return { domain: k, cells, percentiles: [...percentiles], values: [...d.values], recomputed, offCells, verdict };
	});
}
