import { describe, it, expect } from 'vitest';
import {
	experimentalVariogram,
	fitVariogram,
	variogramMisfit,
	gamma,
	type LagBin,
	type Sample,
	type VariogramModel
} from '../../../src/lib/geostat/index';
import { expectAbsClose, expectRelClose } from '../../asserts';
import { choleskyFields } from './simulate';

function bins(model: VariogramModel, hs: number[], dir: 'v' | 'h', pairs = 100): LagBin[] {
	return hs.map((h) => ({ h, gamma: dir === 'v' ? gamma(model, 0, 0, h) : gamma(model, 0, h, 0), pairs }));
}
const lags = (step: number, n: number) => Array.from({ length: n }, (_, i) => (i + 1) * step);

describe('fitVariogram(bins, opts) on exact model bins', () => {
	for (const type of ['spherical', 'exponential', 'gaussian'] as const) {
		it(`fitVariogram recovers ${type} ranges, sill and nugget to 1e-4 relative from exact bins`, () => {
			// Bins computed from the model itself: the weighted misfit is 0 at the truth, so the grid search
			// should land on it to its final resolution (log step ~2e-6; 1e-4 leaves margin).
			const truth: VariogramModel = {
				structures: [
					{ type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
					{ type, sill: 0.9, rangeMajor: 25, rangeMinor: 25, rangeVertical: 1.2 }
				],
				azimuth: 0
			};
			const m = fitVariogram(
				{ vertical: bins(truth, lags(0.1, 30), 'v'), horizontal: bins(truth, lags(3, 20), 'h') },
				{ type, nugget: 'fit' }
			);
			expect(m.structures.map((s) => s.type)).toEqual(['nugget', type]);
			expectRelClose(m.structures[0].sill, 0.1, 1e-4, 'nugget');
			expectRelClose(m.structures[1].sill, 0.9, 1e-4, 'sill');
			expectRelClose(m.structures[1].rangeVertical, 1.2, 1e-4, 'rangeVertical');
			expectRelClose(m.structures[1].rangeMajor, 25, 1e-4, 'rangeMajor');
			expect(m.structures[1].rangeMinor).toBe(m.structures[1].rangeMajor);
			expect(m.azimuth).toBe(0);
		});
	}

	it('fitVariogram without a nugget option returns one structure; a direction without bins takes the other range', () => {
		const truth: VariogramModel = { structures: [{ type: 'exponential', sill: 2, rangeMajor: 3, rangeMinor: 3, rangeVertical: 3 }], azimuth: 0 };
		const m = fitVariogram({ vertical: bins(truth, lags(0.25, 20), 'v') }, { type: 'exponential' });
		expect(m.structures.length).toBe(1);
		expectRelClose(m.structures[0].rangeVertical, 3, 1e-4);
		expect(m.structures[0].rangeMajor).toBe(m.structures[0].rangeVertical);
		expectRelClose(m.structures[0].sill, 2, 1e-4);
	});

	it('fitVariogram honours a fixed sill and a fixed nugget', () => {
		const truth: VariogramModel = {
			structures: [
				{ type: 'nugget', sill: 0.2, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
				{ type: 'spherical', sill: 0.8, rangeMajor: 10, rangeMinor: 10, rangeVertical: 10 }
			],
			azimuth: 0
		};
		const input = { horizontal: bins(truth, lags(1, 15), 'h') };
		const a = fitVariogram(input, { type: 'spherical', nugget: 'fit', sill: 1.5 });
		expectAbsClose(a.structures[0].sill + a.structures[1].sill, 1.5, 1e-12, 'fixed total sill');
		const b = fitVariogram(input, { type: 'spherical', nugget: 0.2 });
		expect(b.structures[0].sill).toBe(0.2);
		expectRelClose(b.structures[1].sill, 0.8, 1e-4);
		expectRelClose(b.structures[1].rangeMajor, 10, 1e-4);
		// A fixed total sill with the nugget fitted: c0 = Σw(1 − f)(γ̂ − S·f) / Σw(1 − f)² recovers the truth.
		const d = fitVariogram(input, { type: 'spherical', nugget: 'fit', sill: 1 });
		expectRelClose(d.structures[0].sill, 0.2, 1e-4, 'fitted nugget under a fixed sill');
		expectRelClose(d.structures[1].rangeMajor, 10, 1e-4);
		const c = fitVariogram(input, { type: 'spherical', nugget: 0.2, sill: 1 });
		expectAbsClose(c.structures[1].sill, 0.8, 1e-15);
		expectRelClose(c.structures[1].rangeMajor, 10, 1e-4);
	});

	it('fitVariogram leaves out bins with fewer than minPairs pairs (default 30)', () => {
		const truth: VariogramModel = { structures: [{ type: 'exponential', sill: 1, rangeMajor: 5, rangeMinor: 5, rangeVertical: 5 }], azimuth: 0 };
		const good = bins(truth, lags(0.5, 20), 'v');
		// A wild bin with 29 pairs must not move the fit; with minPairs 10 it must (a low γ̂ weighs heavily).
		const input = { vertical: [...good, { h: 3.3, gamma: 0.01, pairs: 29 }] };
		expectRelClose(fitVariogram(input, { type: 'exponential' }).structures[0].rangeVertical, 5, 1e-4);
		expect(Math.abs(fitVariogram(input, { type: 'exponential', minPairs: 10 }).structures[0].sill - 1)).toBeGreaterThan(0.01);
	});

	it('fitVariogram(bins) minimises variogramMisfit: the fit is no worse than nearby ranges', () => {
		const noisy: LagBin[] = lags(0.2, 25).map((h, i) => ({ h, gamma: (1 - Math.exp(-h)) * (1 + 0.1 * Math.sin(7 * i)), pairs: 50 + 10 * i }));
		const m = fitVariogram({ vertical: noisy }, { type: 'exponential', nugget: 'fit' });
		const best = variogramMisfit(m, { vertical: noisy });
		expect(best.bins).toBe(25);
		for (const f of [0.9, 0.99, 1.01, 1.1]) {
			const s = m.structures[1];
			const other: VariogramModel = { ...m, structures: [m.structures[0], { ...s, rangeVertical: s.rangeVertical * f }] };
			expect(variogramMisfit(other, { vertical: noisy }).wss).toBeGreaterThanOrEqual(best.wss);
		}
	});
});

describe('variogramMisfit(model, bins)', () => {
	it('variogramMisfit is Σ N/γ̂² (γ̂ − γ)² by hand (Cressie 1985 weights)', () => {
		const model: VariogramModel = { structures: [{ type: 'spherical', sill: 1, rangeMajor: 4, rangeMinor: 4, rangeVertical: 2 }], azimuth: 0 };
		// Vertical h = 1: γ = 1.5·0.5 − 0.5·0.125 = 0.6875; horizontal h = 2: same. γ̂ 0.5 and 1.0, N 40 and 100:
		// 40/0.25·(0.1875)² + 100/1·(0.3125)² = 5.625 + 9.765625 = 15.390625.
		const r = variogramMisfit(model, { vertical: [{ h: 1, gamma: 0.5, pairs: 40 }], horizontal: [{ h: 2, gamma: 1, pairs: 100 }] });
		expect(r.bins).toBe(2);
		expectAbsClose(r.wss, 15.390625, 1e-12);
	});

	it('variogramMisfit is 0 for the model that generated the bins', () => {
		const model: VariogramModel = { structures: [{ type: 'gaussian', sill: 3, rangeMajor: 9, rangeMinor: 9, rangeVertical: 1 }], azimuth: 0 };
		expect(variogramMisfit(model, { vertical: bins(model, lags(0.1, 10), 'v') }).wss).toBe(0);
	});
});

describe('fitVariogram on exactly simulated fields (Cholesky, Davis 1987)', () => {
	it('fitVariogram recovers rangeVertical within 35 %, rangeMajor within 30 % and the sill within 20 %', () => {
		// Exponential, sill 1, aV = 1.5 (24 soundings of 200 samples at 0.1) and aH = 12 (8 plan grids of
		// 20 × 20 at 2). Measured over 30 seeds with exactly these settings: fitted/true rangeVertical mean 1.00,
		// sd 0.105; rangeMajor mean 0.995, sd 0.079; sill mean 1.00, sd 0.056. The tolerances are 3.3, 3.8
		// and 3.6 sd: estimation error of a single field, not numerical error, sets them.
		const aV = 1.5;
		const aH = 12;
		const model: VariogramModel = { structures: [{ type: 'exponential', sill: 1, rangeMajor: aH, rangeMinor: aH, rangeVertical: aV }], azimuth: 0 };
		const ptsV = Array.from({ length: 200 }, (_, i) => ({ x: 0, y: 0, z: -i * 0.1 }));
		const ptsH: { x: number; y: number; z: number }[] = [];
		for (let i = 0; i < 20; i++) for (let j = 0; j < 20; j++) ptsH.push({ x: 2 * i, y: 2 * j, z: 0 });
		const samples: Sample[] = [];
		choleskyFields(ptsV, model, 24, 'fit-v').forEach((f, r) => ptsV.forEach((p, i) => samples.push({ x: 1000 * r, y: 0, z: p.z, value: f[i], sounding: `S${r}` })));
		choleskyFields(ptsH, model, 8, 'fit-h').forEach((f, r) => ptsH.forEach((p, i) => samples.push({ x: p.x, y: p.y + 5000, z: 100 * (r + 1), value: f[i] })));
		const vertical = experimentalVariogram(samples, { direction: 'vertical', lag: 0.1, nLags: 40 });
		const horizontal = experimentalVariogram(samples, { direction: 'horizontal', lag: 2, nLags: 15 });
		const m = fitVariogram({ vertical, horizontal }, { type: 'exponential' });
		const s = m.structures[0];
		expectRelClose(s.rangeVertical, aV, 0.35, 'rangeVertical');
		expectRelClose(s.rangeMajor, aH, 0.3, 'rangeMajor');
		expectRelClose(s.sill, 1, 0.2, 'sill');
	});
});

describe('fitVariogram edge cases', () => {
	it('fitVariogram never returns negative or NaN parameters, even for a decreasing variogram', () => {
		const down: LagBin[] = lags(1, 10).map((h) => ({ h, gamma: 2 - 0.1 * h, pairs: 100 }));
		for (const type of ['spherical', 'exponential', 'gaussian'] as const) {
			const m = fitVariogram({ horizontal: down }, { type, nugget: 'fit' });
			for (const s of m.structures) {
				for (const v of [s.sill, s.rangeMajor, s.rangeMinor, s.rangeVertical]) {
					expect(Number.isNaN(v)).toBe(false);
					expect(v).toBeGreaterThanOrEqual(0);
				}
			}
		}
	});

	it('fitVariogram handles a zero bin, one bin, and huge values', () => {
		const withZero: LagBin[] = [{ h: 1, gamma: 0, pairs: 50 }, ...lags(1, 8).slice(1).map((h) => ({ h, gamma: 1 - Math.exp(-h), pairs: 50 }))];
		const a = fitVariogram({ vertical: withZero }, { type: 'exponential' });
		expect(Number.isFinite(a.structures[0].sill) && Number.isFinite(a.structures[0].rangeVertical)).toBe(true);
		const one = fitVariogram({ vertical: [{ h: 1, gamma: 0.5, pairs: 50 }] }, { type: 'spherical' });
		expect(one.structures[0].sill).toBeGreaterThan(0);
		const big = fitVariogram({ horizontal: lags(1, 10).map((h) => ({ h, gamma: 1e200 * (1 - Math.exp(-h / 3)), pairs: 50 })) }, { type: 'exponential' });
		expectRelClose(big.structures[0].rangeMajor, 9, 1e-4);
		expectRelClose(big.structures[0].sill, 1e200, 1e-4);
	});

	it('fitVariogram rejects bad options and unusable bins with short messages', () => {
		const ok = lags(1, 5).map((h) => ({ h, gamma: h, pairs: 50 }));
		expect(() => fitVariogram({ vertical: ok }, { type: 'cubic' as 'spherical' })).toThrow(TypeError);
		expect(() => fitVariogram({ vertical: ok }, { type: 'spherical', nugget: -1 })).toThrow("nugget must be >= 0 or 'fit'");
		expect(() => fitVariogram({ vertical: ok }, { type: 'spherical', sill: 0 })).toThrow("sill must be > 0 or 'fit'");
		expect(() => fitVariogram({ vertical: ok }, { type: 'spherical', nugget: 2, sill: 1 })).toThrow('nugget exceeds sill');
		expect(() => fitVariogram({ vertical: ok }, { type: 'spherical', minPairs: 51 })).toThrow('no bins with enough pairs');
		expect(() => fitVariogram({}, { type: 'spherical' })).toThrow(Error);
		expect(() => fitVariogram({ vertical: [{ h: 1, gamma: NaN, pairs: 0 }] }, { type: 'spherical' })).toThrow('no bins with enough pairs');
		expect(() => fitVariogram({ vertical: ok.map((b) => ({ ...b, gamma: 0 })) }, { type: 'spherical' })).toThrow('experimental variogram is zero');
	});

	it('fitVariogram repeats bit for bit and does not mutate its bins', () => {
		const v: LagBin[] = lags(0.3, 12).map((h, i) => ({ h, gamma: (1 - Math.exp(-h)) * (1 + 0.05 * Math.cos(i)), pairs: 40 }));
		const copy = JSON.stringify(v);
		const a = fitVariogram({ vertical: v }, { type: 'gaussian', nugget: 'fit' });
		const b = fitVariogram({ vertical: v }, { type: 'gaussian', nugget: 'fit' });
		expect(a).toEqual(b);
		expect(JSON.stringify(v)).toBe(copy);
	});
});

describe('fitVariogram with plan anisotropy (horizontalMinor bins, azimuth)', () => {
	it('fitVariogram recovers rangeMajor, rangeMinor and rangeVertical to 1e-4 from exact bins along and across the azimuth', () => {
		const truth: VariogramModel = {
			structures: [
				{ type: 'nugget', sill: 0.05, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
				{ type: 'exponential', sill: 0.95, rangeMajor: 60, rangeMinor: 18, rangeVertical: 1.1 }
			],
			azimuth: 35
		};
		const rad = (35 * Math.PI) / 180;
		const along = lags(5, 20).map((h) => ({ h, gamma: gamma(truth, h * Math.sin(rad), h * Math.cos(rad), 0), pairs: 100 }));
		const across = lags(3, 20).map((h) => ({ h, gamma: gamma(truth, h * Math.cos(rad), -h * Math.sin(rad), 0), pairs: 100 }));
		const m = fitVariogram({ vertical: bins(truth, lags(0.1, 30), 'v'), horizontal: along, horizontalMinor: across }, { type: 'exponential', nugget: 'fit', sill: 1, azimuth: 35 });
		expect(m.azimuth).toBe(35);
		const s = m.structures[1];
		expectRelClose(s.rangeMajor, 60, 1e-4, 'rangeMajor');
		expectRelClose(s.rangeMinor, 18, 1e-4, 'rangeMinor');
		expectRelClose(s.rangeVertical, 1.1, 1e-4, 'rangeVertical');
		expectRelClose(m.structures[0].sill, 0.05, 1e-4, 'nugget');
		// The misfit compares the minor bins across the model's major axis: 0 for the truth.
		expect(variogramMisfit(truth, { horizontal: along, horizontalMinor: across }).wss).toBeLessThan(1e-20);
	});

	it('fitVariogram with minor bins only takes rangeMajor from them; a non-finite azimuth is refused', () => {
		const truth: VariogramModel = { structures: [{ type: 'spherical', sill: 1, rangeMajor: 9, rangeMinor: 9, rangeVertical: 9 }], azimuth: 0 };
		const m = fitVariogram({ horizontalMinor: bins(truth, lags(1, 15), 'h') }, { type: 'spherical', sill: 1 });
		expectRelClose(m.structures[0].rangeMinor, 9, 1e-4);
		expect(m.structures[0].rangeMajor).toBe(m.structures[0].rangeMinor);
		expect(m.structures[0].rangeVertical).toBe(m.structures[0].rangeMajor);
		expect(() => fitVariogram({ horizontal: bins(truth, lags(1, 5), 'h') }, { type: 'spherical', azimuth: NaN })).toThrow('azimuth must be a finite number');
	});
});
