import { describe, expect, it } from 'vitest';
import { extractDomainSamples, type ExtractOptions, type ExtractSounding } from '../../src/lib/site/index';
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
});
