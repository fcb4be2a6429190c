import { describe, it, expect } from 'vitest';
import {
	createRecipe,
	normalScore,
	prepareSimulation,
	recipeHash,
	regenerate,
	simulate,
	trendResiduals,
	trendValue,
	validateTrend,
	type DomainInput,
	type LinearTrend,
	type Sample,
	type SimulationInput,
	type TargetPoints,
	type VariogramModel
} from '../../../src/lib/geostat/index';
import { expectAbsClose, expectSameBits } from '../../asserts';

const trend: LinearTrend = { origin: { x: 100, y: 0, z: -4 }, constant: 50, gradient: { x: 0.1, y: 0, z: -3 } };
const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1.5 }] };

/** A section of targets, nx × nz nodes at 5 m and 0.5 m. */
function section(nx: number, nz: number): TargetPoints {
	const n = nx * nz;
	const t: TargetPoints = { x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n), domain: new Int32Array(n) };
	for (let k = 0; k < nz; k++) {
		for (let i = 0; i < nx; i++) {
			t.x[k * nx + i] = 80 + 5 * i;
			t.z[k * nx + i] = -1 - 0.5 * k;
		}
	}
	return t;
}

/** Two soundings of trended data: the trend plus a fixed wiggle. */
function trendedSamples(): Sample[] {
	const out: Sample[] = [];
	for (const [x, name] of [[85, 'A'], [115, 'B']] as const) {
		for (let k = 0; k < 12; k++) {
			const z = -1.25 - 0.5 * k;
			out.push({ x, y: 0, z, value: trendValue(trend, x, 0, z) + 2 * ((k * 7) % 5) - 4, sounding: name });
		}
	}
	return out;
}

function domain(extra: Partial<DomainInput> = {}): DomainInput {
	return { samples: trendedSamples(), model, transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 12 }, ...extra };
}

describe('trendValue / trendResiduals / validateTrend', () => {
	it('trendValue(t, x, y, z) is constant + g·(p − origin), exact on small integers', () => {
		expect(trendValue(trend, 100, 0, -4)).toBe(50);
		// 50 + 0.1·10 − 3·(−2 + 4) = 50 + 1 − 6 = 45 (0.1·10 is 1 exactly in binary64).
		expect(trendValue(trend, 110, 7, -2)).toBe(45);
	});

	it('trendResiduals(samples, t) subtracts the trend in sample order and does not mutate', () => {
		const s = trendedSamples();
		const copy = JSON.stringify(s);
		const r = trendResiduals(s, trend);
		expect(r.length).toBe(s.length);
		r.forEach((v, i) => expect(v).toBe(s[i].value - trendValue(trend, s[i].x, s[i].y, s[i].z)));
		expect(JSON.stringify(s)).toBe(copy);
	});

	it('validateTrend rejects a malformed or non-finite trend', () => {
		expect(() => validateTrend(trend)).not.toThrow();
		expect(() => validateTrend({ ...trend, gradient: null } as unknown as LinearTrend)).toThrow(TypeError);
		expect(() => validateTrend({ ...trend, constant: NaN })).toThrow('trend numbers must be finite');
		expect(() => simulate({ seed: 's', domains: [domain({ trend: { ...trend, origin: { x: Infinity, y: 0, z: 0 } } })] }, section(3, 3), 0)).toThrow(RangeError);
	});
});

describe('simulate with a trend (DomainInput.trend)', () => {
	const targets = section(9, 12);

	it('prepareSimulation takes the normal scores of the residuals, not of the values', () => {
		const d = domain({ trend });
		const prep = prepareSimulation({ seed: 's', domains: [d] }, targets);
		const scores = normalScore(trendResiduals(d.samples, trend)).scores;
		// Samples sit between the target rows, so none is merged: dval are the residuals' scores in sample order.
		expectSameBits(prep.domains[0].dval, scores, 'dval');
		expect(prep.domains[0].trend).toEqual(trend);
	});

	it('a domain without a trend simulates exactly as before (the same bits with trend omitted or undefined)', () => {
		const a = simulate({ seed: 's', domains: [domain()] }, targets, 2);
		const b = simulate({ seed: 's', domains: [{ ...domain(), trend: undefined }] }, targets, 2);
		expectSameBits(a, b);
	});

	it('the trend is added back at every target, and a datum keeps its value exactly', () => {
		const samples = trendedSamples();
		const onNode: Sample = { x: 100, y: 0, z: -3, value: 123.456, sounding: 'C' };
		const d = domain({ trend, samples: [...samples, onNode] });
		const out = simulate({ seed: 's', domains: [d] }, targets, 0);
		const at = targets.x.findIndex((x, i) => x === 100 && targets.z[i] === -3);
		expect(out[at]).toBe(123.456);
		// With the same residual field, the output minus the trend equals the no-trend simulation of the residuals.
		const residualDomain = domain({ samples: [...samples, onNode].map((s) => ({ ...s, value: s.value - trendValue(trend, s.x, s.y, s.z) })) });
		const residual = simulate({ seed: 's', domains: [residualDomain] }, targets, 0);
		for (let i = 0; i < out.length; i++) {
			if (i === at) continue;
			expectAbsClose(out[i] - trendValue(trend, targets.x[i], targets.y[i], targets.z[i]), residual[i], 1e-9, `target ${i}`);
		}
	});

	it('unconditional Gaussian fields around a trend average to the trend (200 realizations, 4 standard errors)', () => {
		// transform 'none', mean 0, sill 1: each target's average over R realizations has standard error 1/√R ≈ 0.071.
		const t = section(5, 4);
		const d: DomainInput = { samples: [], model, transform: 'none', mean: 0, kriging: 'simple', search: { maxData: 0, maxSimulated: 8 }, trend };
		const R = 200;
		const sum = new Float64Array(t.x.length);
		for (let r = 0; r < R; r++) simulate({ seed: 'u', domains: [d] }, t, r).forEach((v, i) => (sum[i] += v));
		for (let i = 0; i < sum.length; i++) expectAbsClose(sum[i] / R, trendValue(trend, t.x[i], t.y[i], t.z[i]), 4 / Math.sqrt(R), `target ${i}`);
	});

	it('a recipe carries the trend, regenerates bit for bit, and one without a trend has no trend key', () => {
		const input: SimulationInput = { seed: 'r', domains: [domain({ trend })] };
		const grid = { kind: 'grid' as const, origin: { x: 80, y: 0, z: -6.5 }, spacing: { x: 5, y: 1, z: 0.5 }, counts: { x: 9, y: 1, z: 12 }, domainRuns: [[0, 108]] as [number, number][] };
		const recipe = createRecipe(input, grid);
		expect(recipe.input.domains[0].trend).toEqual(trend);
		const first = regenerate(recipe, 1);
		expectSameBits(regenerate(JSON.parse(JSON.stringify(recipe)), 1), first);
		const plain = createRecipe({ seed: 'r', domains: [domain()] }, grid);
		expect('trend' in plain.input.domains[0]).toBe(false);
		expect(recipeHash(plain)).not.toBe(recipeHash(recipe));
	});
});
