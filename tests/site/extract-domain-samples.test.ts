import { describe, expect, it } from 'vitest';
import { DEFAULT_RULES, extractDomainSamples, type ConditioningRules, type ExtractOptions, type ExtractSounding } from '../../src/lib/site/index';
import { expectAllAbsClose } from '../asserts';

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

	it('extractDomainSamples(soundings, o) reports a sounding without contacts, and one left out by name', () => {
		const r = extractDomainSamples([{ ...S1, contacts: [] }, { ...S2, contacts: [0, -0.15] }], {
			...base,
			rules: { ...DEFAULT_RULES, excludedSoundings: ['S2'] }
		});
		expect(r.samples).toEqual([]);
		expect(r.leftOut).toEqual([
			{ name: 'S1', reason: 'no contacts' },
			{ name: 'S2', reason: 'excluded' }
		]);
		expect(r.warnings[0]).toMatch(/S1 has no contacts yet/);
		expect(r.counts).toMatchObject({ readings: 4, sounding: 4, kept: 0 });
	});
});

/**
 * A crafted sounding: ground at 0, readings at depths 0.1, 0.2 … 3.0 m (index i at depth (i + 1)/10), σ′v of
 * (i + 1) kPa, units A (top at the ground) and B (top at −1.5 m), both in the domain; no value at i = 1 and 21;
 * flagged at i = 2, 19, 24. Rules: minimum depth 0.5 m, minimum σ′v 8 kPa, 0.25 m buffer at contacts, flagged
 * readings left out. By hand, each reading counts under the first rule that removes it:
 * no value i = 1, 21 (2); depth below 0.5 m i = 0, 2, 3 (3); σ′v below 8 kPa i = 4, 5, 6 (3); within 0.25 m of
 * −1.5 m, depths 1.3–1.7 m, i = 12…16 (5); flagged i = 19, 24 (2); kept 30 − 15 = 15.
 * A second sounding left out by name adds its 30 readings to `sounding`.
 */
describe('extractDomainSamples with conditioning rules (crafted sounding)', () => {
	const n = 30;
	const crafted: ExtractSounding = {
		name: 'C1',
		chainage: 5,
		x: 0,
		y: 0,
		groundElevation: 0,
		elevation: Array.from({ length: n }, (_, i) => -(i + 1) / 10),
		unit: Array.from({ length: n }, (_, i) => ((i + 1) / 10 > 1.5 ? 1 : 0)),
		value: Array.from({ length: n }, (_, i) => (i === 1 || i === 21 ? NaN : 0.2 + i / 100)),
		sigmaVeff: Array.from({ length: n }, (_, i) => i + 1),
		flagged: Array.from({ length: n }, (_, i) => i === 2 || i === 19 || i === 24),
		contacts: [0, -1.5]
	};
	const rules: ConditioningRules = { contactBuffer: 0.25, minDepth: 0.5, minSigmaVeff: 8, excludedSoundings: ['C2'], flagged: 'exclude' };
	const opts: ExtractOptions = { ...base, members: [{ unitId: 'A', zone: -1 }, { unitId: 'B', zone: -1 }], rules };

	it('counts what each rule removed and keeps only the other readings', () => {
		const r = extractDomainSamples([crafted, { ...crafted, name: 'C2', chainage: 30 }], opts);
		expect(r.counts).toEqual({ readings: 60, sounding: 30, noValue: 2, minDepth: 3, minSigmaVeff: 3, contactBuffer: 5, flagged: 2, kept: 15 });
		const keptIndex = [7, 8, 9, 10, 11, 17, 18, 20, 22, 23, 25, 26, 27, 28, 29];
		expect(r.samples.map((s) => s.z)).toEqual(keptIndex.map((i) => -(i + 1) / 10));
		expect(r.samples.every((s) => s.sounding === 'C1')).toBe(true);
		expect(r.leftOut).toEqual([{ name: 'C2', reason: 'excluded' }]);
	});

	it('keeping flagged readings and dropping the buffer restores exactly those readings', () => {
		const r = extractDomainSamples([crafted], { ...opts, rules: { ...rules, flagged: 'keep', contactBuffer: 0 } });
		expect(r.counts).toEqual({ readings: 30, sounding: 0, noValue: 2, minDepth: 3, minSigmaVeff: 3, contactBuffer: 0, flagged: 0, kept: 22 });
		const none = extractDomainSamples([crafted], { ...opts, rules: DEFAULT_RULES });
		expect(none.counts.kept).toBe(28);
	});

	it('rules act on readings before averaging to the cell height', () => {
		const r = extractDomainSamples([crafted], { ...opts, cellHeight: 0.5, averaging: 'mean' });
		// The 15 kept readings (−0.8 … −3.0) fall in five 0.5 m windows fixed in elevation (a reading on a window's
		// edge belongs to the upper window): [−1, −0.5) holds −0.8, −0.9, −1.0; then −1.1, −1.2; −1.8, −1.9;
		// −2.1, −2.3, −2.4; −2.6 … −3.0.
		expect(r.counts.kept).toBe(15);
		expect(r.samples.length).toBe(5);
		expect(r.samples[0].value).toBeCloseTo((0.27 + 0.28 + 0.29) / 3, 12);
	});
});