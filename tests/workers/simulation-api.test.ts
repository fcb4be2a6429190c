import { describe, it, expect } from 'vitest';
import { createSimulationApi, PROGRESS_POST_MS } from '../../workers/simulation-api';
import { simulate } from '../../src/lib/geostat/index';
import { expectSameBits } from '../asserts';
import { input, section } from './fixtures';

const nx = 40;
const nz = 12;
const targets = section(nx, nz);

describe('createSimulationApi', () => {
	it('realize passes progress on at most every PROGRESS_POST_MS and once at the end, with the bits of simulate()', () => {
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

	it('warm() simulates its own small section and keeps what was prepared', () => {
		const fresh = createSimulationApi();
		expect(fresh.warm()).toBe(480);
		expect(() => fresh.realize(0)).toThrow('prepare() first');
		const api = createSimulationApi();
		api.prepare(input, targets);
		expect(api.warm()).toBe(480);
		expectSameBits(api.realize(2), simulate(input, targets, 2), 'realization 2 after a warm-up');
	});
});
