import { describe, it, expect } from 'vitest';
import { createSimulationApi, PROGRESS_POST_MS } from '../../workers/simulation-api';
import { simulate } from '../../src/lib/geostat/index';
import type { SimulationInput, TargetPoints } from '../../src/lib/geostat/index';
import { expectSameBits } from '../asserts';

const nx = 40;
const nz = 12;
const targets: TargetPoints = {
	x: Float64Array.from({ length: nx * nz }, (_, i) => i % nx),
	y: new Float64Array(nx * nz),
	z: Float64Array.from({ length: nx * nz }, (_, i) => -Math.floor(i / nx) * 0.25),
	domain: new Int32Array(nx * nz)
};
const input: SimulationInput = {
	seed: 'api',
	domains: [
		{
			samples: [
				{ x: 3.5, y: 0, z: -0.6, value: 12, sounding: 'A' },
				{ x: 30.5, y: 0, z: -1.1, value: 20, sounding: 'B' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1 }] },
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 8, maxSimulated: 12 }
		}
	]
};

describe('createSimulationApi', () => {
	it('realize passes progress on at most every PROGRESS_POST_MS and always at the end, with the bits of simulate()', () => {
		// A clock that moves 1 ms at each report: the engine reports about 100 times a realization (every 1 %).
		let clock = 0;
		const api = createSimulationApi(() => ++clock);
		expect(api.prepare(input, targets)).toBe(nx * nz);
		const posted: [number, number, number][] = [];
		const values = api.realize(4, (d, t) => posted.push([d, t, clock]));
		expectSameBits(values, simulate(input, targets, 4), 'realization 4');
		const reports = clock;
		expect(reports).toBeGreaterThan(PROGRESS_POST_MS);
		// Posted at the first report, then at least 100 reports (100 ms) apart, then once at the end.
		expect(posted[0][2]).toBe(1);
		for (let i = 1; i < posted.length - 1; i++) expect(posted[i][2] - posted[i - 1][2]).toBeGreaterThanOrEqual(PROGRESS_POST_MS);
		expect(posted.length).toBeLessThanOrEqual(Math.ceil(reports / PROGRESS_POST_MS) + 1);
		expect(posted.length).toBeLessThan(reports / 20);
		expect(posted[posted.length - 1].slice(0, 2)).toEqual([nx * nz, nx * nz]);
		for (let i = 1; i < posted.length; i++) expect(posted[i][0]).toBeGreaterThan(posted[i - 1][0]);
	});

	it('without a progress callback realize still works, and before prepare() it refuses', () => {
		const api = createSimulationApi();
		expect(() => api.realize(0)).toThrow('prepare() first');
		api.prepare(input, targets);
		expectSameBits(api.realize(1), simulate(input, targets, 1), 'realization 1');
	});
});
