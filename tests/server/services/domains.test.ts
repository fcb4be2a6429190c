import { describe, expect, it } from 'vitest';
import { mean, median, standardDeviation } from 'simple-statistics';
import {
	averageInWindows,
	declusterWeights,
	domainStatistics,
	extractDomainSamples,
	weightedCdf,
	type ExtractOptions,
	type ExtractSounding
} from '../../../src/lib/server/services/domains';
import { expectAbsClose, expectAllAbsClose } from '../../asserts';

// A tiny hand-built sounding: unit A (index 0) over unit B (index 1), readings every 0.1 m.
const S1: ExtractSounding = {
	name: 'S1',
	chainage: 10,
	x: 500,
	y: 800,
	elevation: [0, -0.1, -0.2, -0.3, -0.4, -0.5],
	unit: [0, 0, 1, 1, 1, 1],
	value: [1, 2, 3, 4, 5, NaN]
};
const S2: ExtractSounding = { ...S1, name: 'S2', chainage: 60, x: 550, value: [10, 20, 30, 40, 50, 60] };
const base: ExtractOptions = {
	geometry: '2d',
	unitIds: ['A', 'B'],
	members: [{ unitId: 'B', zone: -1 }],
	boundaries: new Map(),
	cellHeight: null,
	averaging: 'none'
};
const split = new Map([['B', [{ chainageTop: 50, elevationTop: 5, chainageBottom: 50, elevationBottom: -20 }]]]);

describe('extractDomainSamples(soundings, options)', () => {
	it('extractDomainSamples(soundings, o) keeps the member unit readings with finite values', () => {
		const { samples, warnings } = extractDomainSamples([S1], base);
		expect(samples).toEqual([
			{ x: 10, y: 0, z: -0.2, value: 3, sounding: 'S1' },
			{ x: 10, y: 0, z: -0.3, value: 4, sounding: 'S1' },
			{ x: 10, y: 0, z: -0.4, value: 5, sounding: 'S1' }
		]);
		expect(warnings).toEqual([]);
	});

	it('extractDomainSamples(soundings, o) selects a zone by chainage; the whole unit takes both zones', () => {
		const east = extractDomainSamples([S1, S2], { ...base, boundaries: split, members: [{ unitId: 'B', zone: 1 }] });
		expect(east.samples.map((s) => s.sounding)).toEqual(['S2', 'S2', 'S2', 'S2']);
		const west = extractDomainSamples([S1, S2], { ...base, boundaries: split, members: [{ unitId: 'B', zone: 0 }] });
		expect(west.samples.map((s) => s.value)).toEqual([3, 4, 5]);
		const whole = extractDomainSamples([S1, S2], { ...base, boundaries: split });
		expect(whole.samples.length).toBe(7);
	});

	it('extractDomainSamples(soundings, o) uses easting/northing in 3D and reports soundings it cannot place', () => {
		const r = extractDomainSamples([S1, { ...S2, x: null }], { ...base, geometry: '3d' });
		expect(r.samples[0]).toEqual({ x: 500, y: 800, z: -0.2, value: 3, sounding: 'S1' });
		expect(r.samples.length).toBe(3);
		expect(r.warnings).toEqual(['S2 has no easting/northing and is left out of this 3D domain.']);
		const noChainage = extractDomainSamples([{ ...S1, chainage: null }], base);
		expect(noChainage.samples).toEqual([]);
		expect(noChainage.warnings[0]).toMatch(/no chainage/);
	});

	it('extractDomainSamples(soundings, o) averages in windows of the cell height', () => {
		// Windows of 0.2 m fixed in elevation: [−0.2, 0) holds −0.2 (3); [−0.4, −0.2) holds −0.3, −0.4 (4, 5).
		const r = extractDomainSamples([S1], { ...base, cellHeight: 0.2, averaging: 'mean' });
		expectAllAbsClose(r.samples.map((s) => s.value), [3, 4.5], 1e-12, 'values');
		expectAllAbsClose(r.samples.map((s) => s.z), [-0.2, -0.35], 1e-12, 'elevations');
	});

	it('extractDomainSamples(soundings, o) gives nothing for a domain without members or an empty sounding list', () => {
		expect(extractDomainSamples([S1], { ...base, members: [] }).samples).toEqual([]);
		expect(extractDomainSamples([], base).samples).toEqual([]);
	});
});

describe('averageInWindows(elevation, value, h, averaging)', () => {
	it('averageInWindows(z, v, h, "median") differs from the mean on a skewed window (worked by hand)', () => {
		const z = [-0.05, -0.1, -0.15, -0.25];
		const v = [1, 2, 9, 4];
		const m = averageInWindows(z, v, 0.2, 'mean');
		const md = averageInWindows(z, v, 0.2, 'median');
		expectAllAbsClose(m.value, [4, 4], 1e-12, 'mean');
		expectAllAbsClose(md.value, [2, 4], 1e-12, 'median');
		expect(m.count).toEqual([3, 1]);
		expectAbsClose(m.z[0], -0.1, 1e-12, 'mean elevation');
		// simple-statistics agrees on the window of three.
		expectAbsClose(md.value[0], median([1, 2, 9]), 0, 'median vs simple-statistics');
		expectAbsClose(m.value[0], mean([1, 2, 9]), 1e-12, 'mean vs simple-statistics');
	});

	it('averageInWindows(z, v, h, a) keeps a reading on a window edge in the upper window despite rounding', () => {
		// 0.3 / 0.1 = 2.9999999999999996 in floating point; the reading at 0.3 still opens window 3.
		const r = averageInWindows([0.3, 0.25], [1, 2], 0.1, 'mean');
		expect(r.count).toEqual([1, 1]);
	});

	it('averageInWindows(z, v, h, a) handles empty input and rejects bad arguments', () => {
		expect(averageInWindows([], [], 1, 'mean')).toEqual({ z: [], value: [], count: [] });
		expect(() => averageInWindows([1], [1], 0, 'mean')).toThrow('cell height');
		expect(() => averageInWindows([1], [1, 2], 1, 'mean')).toThrow(RangeError);
		expect(() => averageInWindows([1], [1], 1, 'mode' as 'mean')).toThrow('mean or median');
	});
});

describe('declusterWeights(samples, cell) and domainStatistics(values, weights)', () => {
	// Soundings at chainages 0 and 5 share a 20 m cell; the one at 100 is alone. Two samples each.
	const samples = [0, 0, 5, 5, 100, 100].map((x, i) => ({ x, y: 0, z: -i, value: [1, 1, 3, 3, 10, 10][i], sounding: `S${x}` }));

	it('declusterWeights(samples, cell) follows Deutsch (1989) cell weights and sums to 1', () => {
		// Two occupied cells; the first holds 4 samples → 1/(4·2) each, the second 2 → 1/(2·2) each.
		const w = declusterWeights(samples, { x: 20, y: 20, z: null });
		expectAllAbsClose(w, [1 / 8, 1 / 8, 1 / 8, 1 / 8, 1 / 4, 1 / 4], 1e-15, 'weights');
		expectAbsClose(w.reduce((a, b) => a + b, 0), 1, 1e-15, 'sum');
		// Declustered mean: the clustered low values count half as much: (1+1+3+3)/8 + 10/2 = 6.
		expectAbsClose(domainStatistics(samples.map((s) => s.value), w).mean, 6, 1e-12, 'declustered mean');
	});

	it('declusterWeights(samples, null) gives equal weights summing to 1, and none for no samples', () => {
		const w = declusterWeights(samples, null);
		expectAllAbsClose(w, new Array(6).fill(1 / 6), 1e-15, 'equal');
		expect(declusterWeights([], null).length).toBe(0);
		expect(declusterWeights([], { x: 1, y: 1, z: 1 }).length).toBe(0);
	});

	it('domainStatistics(values, equal weights) matches simple-statistics mean, population sd and median', () => {
		const values = [12, 7, 3.5, 19, 8, 8, 1, 15.25, 4, 10];
		const w = new Array(values.length).fill(1 / values.length);
		const s = domainStatistics(values, w);
		expect(s.n).toBe(10);
		expectAbsClose(s.mean, mean(values), 1e-12, 'mean');
		expectAbsClose(s.sd, standardDeviation(values), 1e-12, 'sd (population)');
		expectAbsClose(s.p50, median(values), 1e-12, 'P50');
	});

	it('domainStatistics(values, w) puts P10 and P90 at the Hyndman & Fan (1996) definition-5 positions', () => {
		// 1…10 at (i − ½)/10: P10 lies between 1 (0.05) and 2 (0.15) → 1.5; P90 between 9 and 10 → 9.5.
		const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
		const s = domainStatistics(values, new Array(10).fill(0.1));
		expectAbsClose(s.p10, 1.5, 1e-12, 'P10');
		expectAbsClose(s.p90, 9.5, 1e-12, 'P90');
	});

	it('domainStatistics(values, w) of one sample has sd 0; of none, NaN', () => {
		expect(domainStatistics([4], [1])).toEqual({ n: 1, mean: 4, sd: 0, p10: 4, p50: 4, p90: 4 });
		const empty = domainStatistics([], []);
		expect(empty.n).toBe(0);
		expect(empty.mean).toBeNaN();
	});
});

describe('weightedCdf(values, weights)', () => {
	it('weightedCdf(values, w) sorts values and places each at the midpoint of its step', () => {
		const c = weightedCdf([3, 1, 2], [1, 1, 1]);
		expect(c.value).toEqual([1, 2, 3]);
		expectAllAbsClose(c.p, [1 / 6, 1 / 2, 5 / 6], 1e-15, 'p');
	});

	it('weightedCdf(values, w) merges duplicates, normalises weights and skips zero weights', () => {
		// Weights 1, 1, 2 (total 4): value 5 holds 2/4 → p 0.25; value 7 holds 2/4 → p 0.75.
		const c = weightedCdf([5, 7, 5, 9], [1, 2, 1, 0]);
		expect(c.value).toEqual([5, 7]);
		expectAllAbsClose(c.p, [0.25, 0.75], 1e-15, 'p');
		expect(weightedCdf([], [])).toEqual({ value: [], p: [] });
		expect(() => weightedCdf([1], [])).toThrow(RangeError);
	});
});
