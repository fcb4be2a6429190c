import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { ksDistance } from '../../src/lib/ensemble/index';
import { expectAbsClose } from '../asserts';

/** The definition, evaluated at every value of either sample: sup |F(x) − G(x)| with right-continuous step CDFs. */
function bruteForce(a: number[], b: number[], w: number[]): number {
	const total = w.reduce((p, q) => p + q, 0);
	let d = 0;
	for (const x of [...a, ...b]) {
		const f = a.filter((v) => v <= x).length / a.length;
		const g = b.reduce((s, v, i) => s + (v <= x ? w[i] : 0), 0) / total;
		d = Math.max(d, Math.abs(f - g));
	}
	return d;
}

describe('ksDistance(values, reference, weights)', () => {
	it('ksDistance is 0 for the same values and 1 for disjoint ones', () => {
		expect(ksDistance([3, 1, 2], [1, 2, 3])).toBe(0);
		expect(ksDistance([1, 2], [5, 6])).toBe(1);
		expect(ksDistance([5, 6], [1, 2])).toBe(1);
	});

	it('ksDistance of [1..4] against [3..6] is 0.5; weights 1:3 on [0, 10] against [0] give 0.75', () => {
		expect(ksDistance([1, 2, 3, 4], [3, 4, 5, 6])).toBe(0.5);
		expect(ksDistance([0], [0, 10], [1, 3])).toBe(0.75);
	});

	it('ksDistance equals the brute-force definition on random weighted samples with ties (within 1e-12)', () => {
		const rng = seedrandom.alea('ks');
		for (let t = 0; t < 40; t++) {
			const a = Array.from({ length: 1 + Math.floor(rng() * 30) }, () => Math.floor(rng() * 12));
			const b = Array.from({ length: 1 + Math.floor(rng() * 30) }, () => Math.floor(rng() * 12) + 0.5 * Math.floor(rng() * 2));
			const w = b.map(() => 0.1 + rng());
			expectAbsClose(ksDistance(a, b, w), bruteForce(a, b, w), 1e-12, `case ${t}`);
		}
	});

	it('ksDistance skips NaN values and refuses empty sides and bad weights', () => {
		expect(ksDistance([NaN, 1, 2], [1, 2])).toBe(0);
		expect(() => ksDistance([NaN], [1])).toThrow(RangeError);
		expect(() => ksDistance([1], [])).toThrow(RangeError);
		expect(() => ksDistance([1], [1, 2], [1])).toThrow('weights must match the reference');
		expect(() => ksDistance([1], [1], [-1])).toThrow('weights must be >= 0');
		expect(() => ksDistance([1], [1], [0])).toThrow(RangeError);
	});
});
