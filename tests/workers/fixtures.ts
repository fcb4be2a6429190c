import type { SimulationInput, TargetPoints } from '../../src/lib/geostat/index';

/** A vertical section of nx × nz targets, 1 m × 0.25 m, one domain. */
export function section(nx: number, nz: number): TargetPoints {
	const n = nx * nz;
	return {
		x: Float64Array.from({ length: n }, (_, i) => i % nx),
		y: new Float64Array(n),
		z: Float64Array.from({ length: n }, (_, i) => -Math.floor(i / nx) * 0.25),
		domain: new Int32Array(n)
	};
}

/** Three readings in two soundings, simulated on section() (one of them sits on a target). */
export const input: SimulationInput = {
	seed: 'pool',
	domains: [
		{
			samples: [
				{ x: 3, y: 0, z: -0.5, value: 12, sounding: 'A' },
				{ x: 30, y: 0, z: -1, value: 20, sounding: 'B' },
				{ x: 30, y: 0, z: -1.25, value: 15, sounding: 'B' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1 }] },
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 8, maxSimulated: 12 }
		}
	]
};
