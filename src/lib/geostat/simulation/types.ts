import type { Sample, VariogramModel } from '../types';
import type { LinearTrend } from './trend';

/** Target points of a simulation, as columns. `domain[i]` is the index of the domain of point i; −1: not simulated. */
export interface TargetPoints {
	x: Float64Array;
	y: Float64Array;
	z: Float64Array;
	domain: Int32Array;
}

/** The order a domain's nodes are visited in (see SearchOptions.path). */
export type PathOrder = 'random' | 'multigrid' | 'random-constant' | 'multigrid-constant';

/** The path orders, in the order a recipe's form offers them. */
export const PATH_ORDERS = ['random', 'multigrid', 'random-constant', 'multigrid-constant'] as const satisfies readonly PathOrder[];

/** Search neighbourhood of one domain. */
export interface SearchOptions {
	/** Most conditioning data per kriging system (≥ 0). */
	maxData: number;
	/** Most previously simulated nodes per kriging system (≥ 0). */
	maxSimulated: number;
	/** Most conditioning data from one sounding; default no limit. */
	maxPerSounding?: number;
	/** Semi-axes of the search ellipsoid (same orientation as the model); default the model's largest ranges. */
	radius?: { major: number; minor: number; vertical: number };
	/**
	 * Order in which the domain's targets are visited: 'random' (default), or 'multigrid' — coarse grids first,
	 * then finer ones, each in random order (see multigridPath), which reproduces long ranges with a small search.
	 * 'multigrid' needs targets on a regular lattice (a grid) and a search small enough for a grid template
	 * (at most 4 million cells); elsewhere the path is random.
	 *
	 * 'random-constant' and 'multigrid-constant': the same orders, drawn once from the seed and the domain and
	 * visited in every realization (a constant path), so each node's kriging system is the same in every
	 * realization: a prepared simulation solves them in its first realization and replays their weights in the
	 * next (see PathPlan), at a small fraction of the cost. The realizations then share the path's approximation
	 * (which nodes screen which), where a path per realization averages it out over the ensemble.
	 */
	path?: PathOrder;
}

/** Everything one domain of a simulation needs. */
export interface DomainInput {
	/** Conditioning data in original units; may be empty (unconditional). */
	samples: Sample[];
	/** Declustering weights for the normal-score transform, one per sample. */
	weights?: number[];
	/**
	 * Variogram of the normal scores, or of the values when transform is 'none' (of the residuals from the
	 * trend, when there is one).
	 */
	model: VariogramModel;
	/**
	 * A linear trend of the mean: the domain is simulated on the residuals v − m (their normal scores, or
	 * themselves when transform is 'none'; mean, zmin and zmax then refer to the residuals) and m is added
	 * back at each target. Targets at a datum still take the datum's value exactly. Omitted: no trend.
	 */
	trend?: LinearTrend;
	/** 'none': a Gaussian field of the values themselves with mean `mean`. */
	transform: 'normal-score' | 'none';
	/** Simple-kriging mean in the kriged space (normal scores or values); default 0. */
	mean?: number;
	kriging: 'simple' | 'ordinary';
	/** Tail bounds of the back-transform. */
	zmin?: number;
	zmax?: number;
	search: SearchOptions;
}

/** A whole simulation: one seed and the domains, indexed as TargetPoints.domain. */
export interface SimulationInput {
	seed: string;
	domains: DomainInput[];
}
