import { ENGINE_VERSION } from './engine-version';
import { recipeSchema } from './schema';
import type { SgsRecipe, TargetDefinition } from './schema';
import type { SimulationInput } from '../simulation/types';

/** An ensemble's size: a recipe that states it names its kind ('sgs') and its N realizations, 0 … N − 1. */
export interface EnsembleOptions {
	realizations: number;
}

/**
 * Builds a recipe from a simulation input and its targets' definition, stamped with ENGINE_VERSION and
 * validated by recipeSchema; with `ensemble`, also its kind 'sgs' and number of realizations, so its hash
 * identifies the whole ensemble. Infinite ranges (no variation along an axis) are written as null, since JSON
 * has no Infinity. Returns a new object; inputs are not mutated.
 * @throws {RangeError} listing the schema's issues when the input is not a valid recipe
 */
export function createRecipe(input: SimulationInput, targets: TargetDefinition, ensemble?: EnsembleOptions): SgsRecipe {
	const head = ensemble ? { engineVersion: ENGINE_VERSION, kind: 'sgs', realizations: ensemble.realizations } : { engineVersion: ENGINE_VERSION };
	const raw = JSON.parse(JSON.stringify({ ...head, input, targets }, (_k, v) => (v === Infinity ? null : v)));
	const parsed = recipeSchema.safeParse(raw);
	if (!parsed.success) {
		throw new RangeError(`invalid recipe: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
	}
	return parsed.data as SgsRecipe;
}

/** The simulation input of a recipe, with null ranges turned back into Infinity. Returns a new object. */
export function recipeInput(recipe: SgsRecipe): SimulationInput {
	return {
		seed: recipe.input.seed,
		domains: recipe.input.domains.map((d) => ({
			...d,
			samples: d.samples.map((s) => ({ ...s })),
			model: {
				azimuth: d.model.azimuth,
				structures: d.model.structures.map((s) => ({
					type: s.type,
					sill: s.sill,
					rangeMajor: s.rangeMajor ?? Infinity,
					rangeMinor: s.rangeMinor ?? Infinity,
					rangeVertical: s.rangeVertical ?? Infinity
				}))
			}
		}))
	};
}
