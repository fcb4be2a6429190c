import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { checkRealizations } from '../../src/lib/ensemble/index';
import { createRecipe, regenerate, type Sample, type SimulationInput, type VariogramModel } from '../../src/lib/geostat/index';

// A 60 m × 5 m section at 1 m × 0.25 m (60 × 20 cells) with two domains: the top 8 rows and the rest.
// Soundings every 10 m with a datum at every cell centre of their column, so data sit on cell centres.
const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1.5 }] };
function samples(seed: string, rows: number[], base: number): Sample[] {
	const rng = seedrandom.alea(seed);
	const out: Sample[] = [];
	for (let s = 0; s < 6; s++) {
		let g = 0;
		for (const k of rows) {
			g = 0.7 * g + 0.7 * (rng() + rng() + rng() - 1.5) * 2;
			out.push({ x: 5.5 + 10 * s, y: 0, z: -5 + 0.125 + 0.25 * k, value: base * Math.exp(0.3 * g), sounding: `S${s}` });
		}
	}
	return out;
}
const lower = Array.from({ length: 12 }, (_, k) => k);
const upper = Array.from({ length: 8 }, (_, k) => 12 + k);
function recipe(m: VariogramModel = model) {
	const input: SimulationInput = {
		seed: 'checks',
		domains: [
			{ samples: samples('up', upper, 0.3), model: m, transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 12 } },
			{ samples: samples('low', lower, 90), model: m, transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 12 } }
		]
	};
	return createRecipe(input, { kind: 'grid', origin: { x: 0.5, y: 0, z: -4.875 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 60, y: 1, z: 20 }, domainRuns: [[1, 720], [0, 480]] }, { realizations: 12 });
}

describe('checkRealizations(recipe, realizations)', () => {
	const r = recipe();
	const reals = Array.from({ length: 12 }, (_, k) => regenerate(r, k));
	const checks = checkRealizations(r, reals);

	it('checkRealizations gives one check per domain with its cells, and data on cell centres reproduced exactly', () => {
		expect(checks.map((c) => [c.domain, c.cells, c.realizations])).toEqual([
			[0, 480, 12],
			[1, 720, 12]
		]);
		for (const c of checks) {
			expect(c.data.inCells).toBe(c.data.data);
			expect(c.data.coincident).toBe(c.data.data);
			expect(c.data.coincidentMaxError).toBe(0);
			// Every datum's cell holds the datum in every realization, so the E-type follows the data (to rounding).
			expect(c.data.etypeCorrelation).toBeGreaterThan(0.999999);
			expect(c.data.verdict.level).toBe('ok');
		}
	});

	it('checkRealizations histogram: one KS distance per realization, median ≤ worst, quantiles for plotting', () => {
		for (const c of checks) {
			expect(c.histogram.ks).toHaveLength(12);
			expect(c.histogram.median).toBeLessThanOrEqual(c.histogram.worst);
			expect(c.histogram.realizations).toHaveLength(12);
			expect(c.histogram.data).toHaveLength(c.histogram.probabilities.length);
			// A third of the domain's cells are data themselves and the rest follow their histogram (Deutsch & Journel 1998).
			expect(c.histogram.median).toBeLessThan(0.2);
		}
	});

	it('checkRealizations variogram: vertical and along-x lags of normal scores beside the exponential model', () => {
		const v = checks[1].variogram!;
		expect(v.of).toBe('normal scores');
		expect(v.directions.map((d) => d.direction)).toEqual(['vertical', 'x']);
		const vertical = v.directions[0].lags;
		expect(vertical[0].h).toBe(0.25);
		// Exponential practical-range form (REFERENCES.md): γ(h) = 1 − exp(−3h/a).
		expect(vertical[0].model).toBeCloseTo(1 - Math.exp((-3 * 0.25) / 1.5), 12);
		for (const l of vertical) expect(l.min).toBeLessThanOrEqual(l.max);
	});

	it('checkRealizations names a normal-score sill that is not 1 as a cause', () => {
		const twice: VariogramModel = { azimuth: 90, structures: [{ ...model.structures[0], sill: 2 }] };
		const r2 = recipe(twice);
		const c = checkRealizations(r2, [regenerate(r2, 0), regenerate(r2, 1)]);
		expect(c[1].variogram!.verdict.level).not.toBe('ok');
		expect(c[1].variogram!.verdict.message).toMatch(/total sill is 2, not 1/);
	});

	it('checkRealizations refuses no realizations and realizations of another size', () => {
		expect(() => checkRealizations(r, [])).toThrow('no realizations');
		expect(() => checkRealizations(r, [new Float64Array(3)])).toThrow(RangeError);
	});
});
