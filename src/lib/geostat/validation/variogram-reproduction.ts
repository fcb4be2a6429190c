import sin from '@stdlib/math-base-special-sin';
import cos from '@stdlib/math-base-special-cos';
import { experimentalVariogram } from '../variogram/experimental';
import { compileVariogram } from '../variogram/model';
import type { ExperimentalOptions, LagBin, Sample, VariogramModel } from '../types';
import type { TargetPoints } from '../simulation/types';

/** One lag of variogramReproduction: the experimental bin and the model at the bin's mean separation. */
export interface VariogramReproductionLag extends LagBin {
	model: number;
}

/**
 * Variogram reproduction (Deutsch & Journel 1998, ch. V; Leuangthong et al. 2004): the experimental
 * variogram of a realization's values at its targets (NaN and domain −1 skipped), by experimentalVariogram
 * with the given options, beside the model evaluated at each bin's mean separation along the bin's
 * direction ('vertical': along z; 'horizontal' and 3D directions: along their azimuth and dip, the plan
 * direction defaulting to the model's major axis). Pass the model of the values for transform 'none', or
 * compare normal scores with the normal-score model. Does not mutate its inputs.
 * @throws {RangeError} if the realization's length differs from the targets', and as experimentalVariogram
 */
export function variogramReproduction(
	realization: ArrayLike<number>,
	targets: TargetPoints,
	model: VariogramModel,
	opts: ExperimentalOptions
): VariogramReproductionLag[] {
	const n = targets.x.length;
	if (realization.length !== n) throw new RangeError('realization and targets differ in length');
	const samples: Sample[] = [];
	for (let i = 0; i < n; i++) {
		const v = realization[i];
		if (targets.domain[i] < 0 || !Number.isFinite(v)) continue;
		samples.push({ x: targets.x[i], y: targets.y[i], z: targets.z[i], value: v });
	}
	const bins = experimentalVariogram(samples, opts);
	const g = compileVariogram(model);
	const deg = Math.PI / 180;
	let ux = 0;
	let uy = 0;
	let uz = 0;
	if (opts.direction === 'vertical') uz = 1;
	else {
		const az = (opts.direction === 'horizontal' ? (opts.azimuth ?? model.azimuth) : opts.direction.azimuth) * deg;
		const dip = (opts.direction === 'horizontal' ? 0 : opts.direction.dip) * deg;
		ux = sin(az) * cos(dip);
		uy = cos(az) * cos(dip);
		uz = -sin(dip);
	}
	return bins.map((b) => ({ ...b, model: g.gamma(b.h * ux, b.h * uy, b.h * uz) }));
}
