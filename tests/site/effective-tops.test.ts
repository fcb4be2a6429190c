import { describe, expect, it } from 'vitest';
import { effectiveTops } from '../../src/lib/site/index';

describe('effectiveTops(unitIds, stored, ground)', () => {
	const units = ['clay', 'sand', 'dense'];

	it('effectiveTops(units, {}, ground) starts the top unit at the ground surface and leaves the others absent', () => {
		const tops = effectiveTops(units, new Map(), 3.96);
		expect([...tops]).toEqual([['clay', { top: 3.96, source: 'ground' }]]);
	});

	it('effectiveTops(units, stored, ground) keeps stored tops as measured or interpolated', () => {
		const stored = new Map([
			['sand', { top: 2.1, interpolated: false }],
			['dense', { top: -6.2, interpolated: true }]
		]);
		const tops = effectiveTops(units, stored, 4);
		expect(tops.get('clay')).toEqual({ top: 4, source: 'ground' });
		expect(tops.get('sand')).toEqual({ top: 2.1, source: 'measured' });
		expect(tops.get('dense')).toEqual({ top: -6.2, source: 'interpolated' });
	});

	it('effectiveTops(units, stored, ground) takes a stored top of the top unit over the ground surface', () => {
		const tops = effectiveTops(units, new Map([['clay', { top: 3.5, interpolated: false }]]), 4);
		expect(tops.get('clay')).toEqual({ top: 3.5, source: 'measured' });
	});

	it('effectiveTops([], stored, ground) is empty and the input map is not mutated', () => {
		const stored = new Map([['sand', { top: 1, interpolated: false }]]);
		expect(effectiveTops([], stored, 4).size).toBe(0);
		expect([...stored]).toEqual([['sand', { top: 1, interpolated: false }]]);
	});
});
