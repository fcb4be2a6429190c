import { describe, expect, it } from 'vitest';
import { fitVariogram, gamma, variogramMisfit, type VariogramModel } from '../../src/lib/geostat/index';
import {
	autoFit,
	computeVariograms,
	defaultSettings,
	lagTableCsv,
	modelFromParameters,
	modelMisfit,
	parametersFromModel,
	plateauCheck,
	prepareSamples,
	rangeSensitivity,
	type ExperimentalResult,
	type VariogramSettings
} from '../../src/lib/variography/index';
import { expectRelClose } from '../asserts';
import { handDomain } from './fixture';

const settings: VariogramSettings = {
	transform: 'normal-score',
	declustered: true,
	trend: 'none',
	vertical: { lag: 0.1, nLags: 20, lagTolerance: 0.05 },
	horizontal: { lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1, azimuth: null, angleTolerance: 22.5 },
	minPairs: 30
};

async function bins(): Promise<ExperimentalResult> {
	return computeVariograms(prepareSamples(handDomain(), settings), settings, { pause: async () => {} });
}

describe('autoFit(bins, options)', () => {
	it('autoFit holds the total sill at options.variance by default and returns fitVariogram\'s parameters and misfit (exact)', async () => {
		const r = await bins();
		const input = { vertical: r.vertical, horizontal: r.horizontal };
		const fit = autoFit(input, { type: 'exponential', nugget: 'fit', minPairs: 30, azimuth: 0, variance: r.variance });
		const direct = fitVariogram(input, { type: 'exponential', nugget: 'fit', sill: r.variance, minPairs: 30 });
		expect(direct.structures[0].type).toBe('nugget');
		expect(fit.parameters.sill).toBe(r.variance);
		expect(fit.parameters.nugget).toBe(direct.structures[0].sill);
		expect(fit.parameters.rangeVertical).toBe(direct.structures[1].rangeVertical);
		expect(fit.parameters.rangeMajor).toBe(direct.structures[1].rangeMajor);
		expect(fit.parameters.rangeMinor).toBe(fit.parameters.rangeMajor);
		const m = variogramMisfit(fit.model, input);
		expect(fit.misfit.total).toEqual({ wss: m.wss, bins: m.bins, perBin: m.wss / m.bins });
		// The model built back from the parameters gives the fitted γ within rounding of sill − nugget (1e-12 relative).
		for (const h of [0.05, 0.3, 1.7]) expectRelClose(gamma(fit.model, 0, 0, h), gamma(direct, 0, 0, h), 1e-12, `γ(${h})`);
	});

	it("autoFit with sill 'fit' fits the sill freely, as fitVariogram with sill 'fit'", async () => {
		const r = await bins();
		const free = autoFit(r, { type: 'exponential', nugget: 'fit', sill: 'fit', minPairs: 30, azimuth: 0 });
		const direct = fitVariogram({ vertical: r.vertical, horizontal: r.horizontal }, { type: 'exponential', nugget: 'fit', minPairs: 30 });
		expect(free.parameters.sill).toBe(direct.structures[0].sill + direct.structures[1].sill);
		expect(free.parameters.rangeMajor).toBe(direct.structures[1].rangeMajor);
	});

	it("autoFit with nugget 'none' fits no nugget, and a fixed nugget is held", async () => {
		const r = await bins();
		const none = autoFit(r, { type: 'spherical', nugget: 'none', minPairs: 30, azimuth: 0, variance: r.variance });
		expect(none.parameters.nugget).toBe(0);
		const held = autoFit(r, { type: 'gaussian', nugget: 0.05, minPairs: 30, azimuth: 0, variance: r.variance });
		expect(held.parameters.nugget).toBe(0.05);
		expect(held.parameters.sill).toBe(r.variance);
	});

	it('autoFit throws without a variance to hold the sill at, and the engine\'s Error when no bin has enough pairs', async () => {
		const r = await bins();
		expect(() => autoFit(r, { type: 'exponential', nugget: 'fit', minPairs: 30, azimuth: 0 })).toThrow('variance must be > 0 to hold the sill at it');
		expect(() => autoFit(r, { type: 'exponential', nugget: 'fit', minPairs: 30, azimuth: 0, variance: 0 })).toThrow(RangeError);
		expect(() => autoFit(r, { type: 'exponential', nugget: 'fit', minPairs: 1e9, azimuth: 0, variance: 1 })).toThrow('no bins with enough pairs');
		expect(() => autoFit(r, { type: 'exponential', nugget: 2, minPairs: 30, azimuth: 0, variance: 1 })).toThrow('nugget exceeds sill');
	});
});

describe('modelMisfit(model, bins, minPairs)', () => {
	it('modelMisfit splits the misfit by direction; the parts add up to the total (1e-12 relative)', async () => {
		const r = await bins();
		const model = modelFromParameters({ type: 'exponential', nugget: 0.1, sill: 1, rangeVertical: 0.8, rangeMajor: 40, rangeMinor: 40, azimuth: 0 });
		const m = modelMisfit(model, r, 30);
		expect(m.vertical!.wss).toBe(variogramMisfit(model, { vertical: r.vertical }).wss);
		expect(m.horizontal!.wss).toBe(variogramMisfit(model, { horizontal: r.horizontal }).wss);
		expectRelClose(m.vertical!.wss + m.horizontal!.wss, m.total!.wss, 1e-12, 'sum');
		expect(m.total!.bins).toBe(m.vertical!.bins + m.horizontal!.bins);
	});

	it('modelMisfit gives null for a direction without usable bins, and still throws on a bad model', async () => {
		const r = await bins();
		const model = modelFromParameters({ type: 'spherical', nugget: 0, sill: 1, rangeVertical: 1, rangeMajor: 10, rangeMinor: 10, azimuth: 0 });
		const empty = r.horizontal.map((b) => ({ ...b, pairs: 0, gamma: NaN }));
		expect(modelMisfit(model, { vertical: r.vertical, horizontal: empty }, 30).horizontal).toBeNull();
		const bad = { azimuth: 0, structures: [{ type: 'spherical', sill: -1, rangeMajor: 1, rangeMinor: 1, rangeVertical: 1 }] } as VariogramModel;
		expect(() => modelMisfit(bad, r, 30)).toThrow(RangeError);
	});
});

describe('rangeSensitivity(model, horizontal)', () => {
	it('rangeSensitivity halves and doubles the horizontal range only; numbers equal variogramMisfit (exact)', async () => {
		const r = await bins();
		const p = { type: 'exponential' as const, nugget: 0.1, sill: 1, rangeVertical: 0.8, rangeMajor: 40, rangeMinor: 40, azimuth: 0 };
		const s = rangeSensitivity(modelFromParameters(p), r.horizontal)!;
		const at = (range: number) => variogramMisfit(modelFromParameters({ ...p, rangeMajor: range, rangeMinor: range }), { horizontal: r.horizontal });
		expect(s.range).toBe(40);
		expect(s.base.wss).toBe(at(40).wss);
		expect(s.halved.wss).toBe(at(20).wss);
		expect(s.doubled.wss).toBe(at(80).wss);
		expect(s.curve).toHaveLength(25);
		// Log-spaced from ¼ to 4 times the range; the middle point is the model itself (1e-12 relative).
		expectRelClose(s.curve[0].range, 10, 1e-12, 'first');
		expectRelClose(s.curve[24].range, 160, 1e-12, 'last');
		expectRelClose(s.curve[12].range, 40, 1e-12, 'middle');
		expectRelClose(s.curve[12].perBin, s.base.perBin, 1e-12, 'middle misfit');
	});

	it('rangeSensitivity at the automatic fit: halving or doubling the horizontal range never lowers the misfit', async () => {
		// At the joint least-squares optimum the horizontal bins' misfit is minimal in the horizontal range with the
		// other parameters held (else the joint objective could be lowered); 1e-9 relative for the fit's grid search.
		// Bins of a known model (nugget 0.2 + exponential, sill 1, practical range 40 m) with a ±5 % wobble, 200 pairs each.
		const truth = modelFromParameters({ type: 'exponential', nugget: 0.2, sill: 1, rangeVertical: 1, rangeMajor: 40, rangeMinor: 40, azimuth: 0 });
		const horizontal = Array.from({ length: 12 }, (_, k) => {
			const h = 7.5 * (k + 1);
			return { h, gamma: gamma(truth, 0, h, 0) * (1 + 0.05 * Math.sin(3 * k)), pairs: 200 };
		});
		const r = { horizontal };
		const fit = autoFit({ horizontal }, { type: 'exponential', nugget: 'fit', minPairs: 30, azimuth: 0, variance: 1 });
		// The argument needs the fitted range inside the fit's search bounds [0.1·h_min, 10·h_max] (here 0.75–900 m).
		expect(fit.parameters.rangeMajor).toBeGreaterThan(2 * 0.75);
		expect(fit.parameters.rangeMajor).toBeLessThan(900 / 4);
		const s = rangeSensitivity(fit.model, r.horizontal)!;
		expect(s.halved.wss).toBeGreaterThanOrEqual(s.base.wss * (1 - 1e-9));
		expect(s.doubled.wss).toBeGreaterThanOrEqual(s.base.wss * (1 - 1e-9));
		for (const pt of s.curve) expect(pt.perBin).toBeGreaterThanOrEqual(s.base.perBin * (1 - 1e-6));
	});

	it('rangeSensitivity returns null without usable horizontal bins and rejects bad options', async () => {
		const r = await bins();
		const model = modelFromParameters({ type: 'spherical', nugget: 0, sill: 1, rangeVertical: 1, rangeMajor: 10, rangeMinor: 10, azimuth: 0 });
		expect(rangeSensitivity(model, [])).toBeNull();
		expect(() => rangeSensitivity(model, r.horizontal, { points: 1 })).toThrow(RangeError);
		expect(() => rangeSensitivity({ azimuth: 0, structures: [{ type: 'nugget', sill: 1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 }] }, r.horizontal)).toThrow(
			'model has no horizontal range'
		);
	});
});

describe('modelFromParameters / parametersFromModel', () => {
	it('modelFromParameters puts the nugget first and round-trips through parametersFromModel (exact)', () => {
		const p = { type: 'gaussian' as const, nugget: 0.25, sill: 1.5, rangeVertical: 1.2, rangeMajor: 33, rangeMinor: 33, azimuth: 30 };
		const m = modelFromParameters(p);
		expect(m.structures.map((s) => s.type)).toEqual(['nugget', 'gaussian']);
		expect(m.structures[1].sill).toBe(1.25);
		expect(parametersFromModel(m)).toEqual(p);
	});

	it('modelFromParameters rejects a negative nugget, a sill below the nugget and zero ranges', () => {
		const p = { type: 'spherical' as const, nugget: 0, sill: 1, rangeVertical: 1, rangeMajor: 1, rangeMinor: 1, azimuth: 0 };
		expect(() => modelFromParameters({ ...p, nugget: -0.1 })).toThrow('nugget must be >= 0');
		expect(() => modelFromParameters({ ...p, nugget: 2 })).toThrow('sill must be >= nugget');
		expect(() => modelFromParameters({ ...p, rangeMajor: 0, rangeMinor: 0 })).toThrow('ranges must be > 0');
		expect(() => modelFromParameters({ ...p, rangeVertical: NaN })).toThrow('ranges must be > 0');
		expect(() => parametersFromModel({ azimuth: 0, structures: [] })).toThrow(RangeError);
	});
});

describe('lagTableCsv(bins, options) and defaultSettings(data)', () => {
	it('lagTableCsv writes one row per bin, blanks for empty bins, and the model column', () => {
		const csv = lagTableCsv(
			[
				{ h: 0.9, gamma: 0.5, pairs: 40 },
				{ h: 2, gamma: NaN, pairs: 0 }
			],
			{ lag: 1, lengthUnit: 'm', model: (h) => h / 2 }
		);
		expect(csv).toBe('bin,lag_m,mean_separation_m,gamma,pairs,model_gamma\n1,1,0.9,0.5,40,0.45\n2,2,,,0,1\n');
	});

	it('lagTableCsv rounds for people: the nominal lag without binary noise, four significant figures, exact pair counts', () => {
		const csv = lagTableCsv(
			[
				{ h: 0.19873456, gamma: 0.412345678, pairs: 1234567 },
				{ h: 0.401, gamma: 0.7, pairs: 900 },
				{ h: 0.61234, gamma: 0.95555555, pairs: 800 }
			],
			{ lag: 0.2, lengthUnit: 'm', model: (h) => 1 - Math.exp(-h) }
		);
		// 3 × 0.2 is 0.6000000000000001 in binary; 1 − exp(−0.61234) = 0.45790… (any calculator).
		expect(csv.split('\n')[3]).toBe('3,0.6,0.6123,0.9556,800,0.4579');
		expect(csv.split('\n')[1]).toBe('1,0.2,0.1987,0.4123,1234567,0.1802');
		expect(csv).not.toMatch(/0{6,}|9{6,}/);
	});

	it('defaultSettings reads the reading spacing and the sounding spacing off the samples', () => {
		// 0.05 m readings → vertical lag 0.1 m (the floor). Nearest-neighbour distances 7.5 m (×4) and 15 m (×4):
		// median 11.25 m → horizontal lag 10 m (1-2-2.5-5 steps from below).
		const s = defaultSettings(handDomain());
		expect(s.vertical).toEqual({ lag: 0.1, nLags: 30, lagTolerance: 0.05 });
		expect(s.horizontal.lag).toBe(10);
		expect(s.horizontal.lagTolerance).toBe(5);
		// Largest separation 105 m → lags to 52.5 m: 6 lags of 10 m.
		expect(s.horizontal.nLags).toBe(6);
		// Band: the larger of half the vertical lag (0.05) and the reading spacing (0.05).
		expect(s.horizontal.verticalBand).toBe(0.05);
		expect(s.horizontal.azimuth).toBeNull();
	});

	it('defaultSettings uses the declustering weights only when the domain sets a declustering cell', () => {
		expect(defaultSettings({ ...handDomain(), domain: { declusterCell: { x: 40, y: 40, z: null } } }).declustered).toBe(true);
		expect(defaultSettings({ ...handDomain(), domain: { declusterCell: null } }).declustered).toBe(false);
	});

	it('defaultSettings takes a 0.2 m averaging cell as the vertical lag (0.2 / 0.1 rounds below 2 in binary)', () => {
		const d = handDomain({ soundings: 3, readings: 40 });
		d.samples.z = d.samples.z.map((_, i) => 1 - 0.2 * (i % 40));
		const s = defaultSettings(d);
		expect(s.vertical.lag).toBe(0.2);
		expect(s.vertical.nLags).toBe(15);
		expect(s.horizontal.verticalBand).toBe(0.2);
	});
});

describe('rangeSensitivity by direction, and the ranges the data admit', () => {
	it('rangeSensitivity varies only its own direction\'s range against its own bins', async () => {
		const r = await bins();
		const p = { type: 'exponential' as const, nugget: 0.1, sill: 1, rangeVertical: 0.8, rangeMajor: 40, rangeMinor: 25, azimuth: 30 };
		const model = modelFromParameters(p);
		const v = rangeSensitivity(model, r.vertical, { direction: 'vertical' })!;
		expect(v.range).toBe(0.8);
		expect(v.doubled.wss).toBe(variogramMisfit(modelFromParameters({ ...p, rangeVertical: 1.6 }), { vertical: r.vertical }).wss);
		const minor = rangeSensitivity(model, r.horizontal, { direction: 'minor' })!;
		expect(minor.range).toBe(25);
		expect(minor.halved.wss).toBe(variogramMisfit(modelFromParameters({ ...p, rangeMinor: 12.5 }), { horizontalMinor: r.horizontal }).wss);
		const major = rangeSensitivity(model, r.horizontal, { direction: 'major' })!;
		expect(major.doubled.wss).toBe(variogramMisfit(modelFromParameters({ ...p, rangeMajor: 80 }), { horizontal: r.horizontal }).wss);
	});

	it('the admitted interval holds the model\'s range, keeps the misfit under its limit, and stops where it is crossed', async () => {
		const r = await bins();
		const fit = autoFit(r, { type: 'exponential', nugget: 'fit', minPairs: 30, azimuth: 0, variance: r.variance });
		for (const [direction, b] of [['vertical', r.vertical], ['horizontal', r.horizontal]] as const) {
			const s = rangeSensitivity(fit.model, b, { direction })!;
			const { low, high, limit } = s.admitted;
			expect(low).toBeLessThanOrEqual(s.range);
			expect(high).toBeGreaterThanOrEqual(s.range);
			// limit = base + max(½·base, 1) (ADMITTED_TOLERANCE), exact.
			expect(limit).toBe(s.base.perBin + Math.max(0.5 * s.base.perBin, 1));
			const key = direction === 'vertical' ? 'rangeVertical' : 'rangeMajor';
			const at = (range: number) => {
				const q = { ...fit.parameters, [key]: range, ...(direction === 'horizontal' ? { rangeMinor: range } : {}) };
				return variogramMisfit(modelFromParameters(q), direction === 'vertical' ? { vertical: b } : { horizontal: b });
			};
			const perBin = (range: number) => at(range).wss / at(range).bins;
			expect(perBin(low)).toBeLessThanOrEqual(limit * (1 + 1e-12));
			expect(perBin(high)).toBeLessThanOrEqual(limit * (1 + 1e-12));
			// One 3.5 % scan step beyond each closed end the misfit is over the limit.
			if (!s.admitted.lowOpen) expect(perBin(low / 1.04)).toBeGreaterThan(limit * 0.98);
			if (!s.admitted.highOpen) expect(perBin(high * 1.04)).toBeGreaterThan(limit * 0.98);
		}
	});
});

describe('plateauCheck(bins, variance, minPairs)', () => {
	const flat = (g: number, n = 6, step = 1) => Array.from({ length: n }, (_, k) => ({ h: (k + 1) * step, gamma: g, pairs: 100 }));

	it('plateauCheck averages the outer third of the usable bins by pairs and says nothing within 20 %', () => {
		// The outer third of h = 1..6 is h ≥ 4: bins 4–6 with γ 1.1 and pairs 100 each → 1.1.
		const c = plateauCheck({ vertical: flat(1.1), horizontal: [...flat(0.2, 3), ...flat(0.9, 3).map((b) => ({ ...b, h: b.h + 3 }))] }, 1, 30);
		expectRelClose(c.vertical!.gamma, 1.1, 1e-12, 'vertical plateau');
		expect(c.vertical!.bins).toBe(3);
		expect(c.vertical!.pairs).toBe(300);
		expect(c.horizontal!.gamma).toBe(0.9);
		expect(c.departures).toEqual([]);
		expect(c.advice).toBeNull();
	});

	it('plateauCheck names a departure beyond 20 % each way, and the likely causes', () => {
		const c = plateauCheck({ vertical: flat(1.5), horizontal: flat(0.6) }, 1, 30);
		expect(c.departures).toHaveLength(2);
		expect(c.departures[0]).toMatch(/vertical variogram levels off at 1.5, 50 % above/);
		expect(c.departures[1]).toMatch(/horizontal variogram levels off at 0.6, 40 % below/);
		expect(c.advice).toMatch(/trend with depth/);
		expect(c.advice).toMatch(/zonal anisotropy/);
		expect(c.advice).toMatch(/mixed populations/);
	});

	it('plateauCheck leaves out bins under minPairs and needs two usable bins per direction', () => {
		const few = [{ h: 1, gamma: 5, pairs: 10 }, { h: 2, gamma: 5, pairs: 10 }, { h: 3, gamma: 1, pairs: 50 }];
		const c = plateauCheck({ vertical: few, horizontal: flat(1), horizontalMinor: flat(0.5) }, 1, 30);
		expect(c.vertical).toBeNull();
		expect(c.minor!.ratio).toBe(0.5);
		expect(c.departures).toHaveLength(1);
		expect(c.departures[0]).toMatch(/across the azimuth/);
	});
});
