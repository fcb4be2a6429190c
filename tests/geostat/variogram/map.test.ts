import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { experimentalVariogramMap, type Sample } from '../../../src/lib/geostat/index';
import { expectRelClose } from '../../asserts';

function cloud(n: number, seed: string): Sample[] {
	const rng = seedrandom(seed);
	const out: Sample[] = [];
	for (let s = 0; s < n; s++) {
		const x = 100 * rng();
		const y = 100 * rng();
		for (let k = 0; k < 6; k++) out.push({ x, y, z: -0.2 * k + 0.05 * rng(), value: rng() * 10, sounding: `S${s}` });
	}
	return out;
}

describe('experimentalVariogramMap(samples, opts)', () => {
	it('experimentalVariogramMap on two soundings puts ½(Δv)² at ±(dx, dy) by hand', () => {
		const samples: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 1, sounding: 'A' },
			{ x: 10, y: 5, z: 0.05, value: 4, sounding: 'B' },
			// Same sounding: no plan pair. Beyond the band: no pair either.
			{ x: 0, y: 0, z: -1, value: 9, sounding: 'A' }
		];
		const m = experimentalVariogramMap(samples, { lag: 5, nLags: 2, verticalBand: 0.1 });
		expect(m.size).toBe(5);
		const at = (i: number, j: number) => (j + 2) * 5 + i + 2;
		expect(m.pairs[at(2, 1)]).toBe(1);
		expect(m.gamma[at(2, 1)]).toBe(4.5);
		expect([m.dx[at(2, 1)], m.dy[at(2, 1)]]).toEqual([10, 5]);
		expect(m.pairs[at(-2, -1)]).toBe(1);
		expect([m.dx[at(-2, -1)], m.dy[at(-2, -1)]]).toEqual([-10, -5]);
		expect(m.pairs.reduce((a, b) => a + b, 0)).toBe(2);
		// An empty cell: no pairs, NaN, its nominal offset.
		expect(m.pairs[at(1, 0)]).toBe(0);
		expect(Number.isNaN(m.gamma[at(1, 0)])).toBe(true);
		expect([m.dx[at(1, 0)], m.dy[at(1, 0)]]).toEqual([5, 0]);
	});

	it('experimentalVariogramMap equals an all-pairs loop (pairs exact, γ to 1e-12) and is symmetric', () => {
		const samples = cloud(25, 'map');
		const opts = { lag: 8, nLags: 6, verticalBand: 0.1 };
		const m = experimentalVariogramMap(samples, opts);
		const count = new Float64Array(m.size * m.size);
		const sq = new Float64Array(m.size * m.size);
		for (let i = 0; i < samples.length; i++) {
			for (let j = 0; j < samples.length; j++) {
				const a = samples[i];
				const b = samples[j];
				if (i === j || a.sounding === b.sounding || Math.abs(a.z - b.z) > opts.verticalBand) continue;
				const ci = Math.round((b.x - a.x) / opts.lag);
				const cj = Math.round((b.y - a.y) / opts.lag);
				if (Math.abs(ci) > opts.nLags || Math.abs(cj) > opts.nLags) continue;
				// Each ordered pair once; ties on a half-cell would round differently each way and are avoided by random data.
				const c = (cj + opts.nLags) * m.size + ci + opts.nLags;
				count[c]++;
				sq[c] += (b.value - a.value) ** 2;
			}
		}
		let total = 0;
		for (let c = 0; c < count.length; c++) {
			expect(m.pairs[c], `cell ${c}`).toBe(count[c]);
			total += count[c];
			if (count[c] > 0) expectRelClose(m.gamma[c], sq[c] / (2 * count[c]), 1e-12, `cell ${c}`);
			const mirror = count.length - 1 - c;
			expect(m.pairs[mirror]).toBe(m.pairs[c]);
			if (m.pairs[c] > 0) expect(m.gamma[mirror]).toBe(m.gamma[c]);
		}
		expect(total).toBeGreaterThan(100);
	});

	it('experimentalVariogramMap rejects bad options and data; empty input gives an empty map', () => {
		expect(() => experimentalVariogramMap('x' as unknown as Sample[], { lag: 1, nLags: 1 })).toThrow(TypeError);
		expect(() => experimentalVariogramMap([], { lag: 0, nLags: 1 })).toThrow('lag must be > 0');
		expect(() => experimentalVariogramMap([], { lag: 1, nLags: 1.5 })).toThrow('nLags must be a positive integer');
		expect(() => experimentalVariogramMap([], { lag: 1, nLags: 1, verticalBand: -1 })).toThrow('verticalBand must be >= 0');
		expect(() => experimentalVariogramMap([], { lag: 1, nLags: 600 })).toThrow('map too large');
		expect(() => experimentalVariogramMap([{ x: NaN, y: 0, z: 0, value: 1 }], { lag: 1, nLags: 1 })).toThrow(RangeError);
		const empty = experimentalVariogramMap([], { lag: 2, nLags: 3 });
		expect(empty.pairs.every((p) => p === 0)).toBe(true);
	});
});
