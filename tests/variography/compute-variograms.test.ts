import { describe, expect, it } from 'vitest';
import { experimentalVariogram, experimentalVariogramMap, fitLinearTrend, normalScore, trendResiduals, weightedVariance, type LagBin } from '../../src/lib/geostat/index';
import { CancelledError } from '../../src/lib/cancelled-error';
import { computeVariograms, domainTrend, prepareSamples, type VariogramSettings } from '../../src/lib/variography/index';
import { expectRelClose } from '../asserts';
import { handDomain } from './fixture';

const settings: VariogramSettings = {
	transform: 'none',
	declustered: false,
	trend: 'none',
	vertical: { lag: 0.1, nLags: 20, lagTolerance: 0.05 },
	horizontal: { lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1, azimuth: null, angleTolerance: 22.5 },
	minPairs: 30
};

/** Same pair counts exactly; h and gamma within 1e-12 relative (only the summation order differs). */
function expectSameBins(actual: LagBin[], expected: LagBin[]) {
	expect(actual.length).toBe(expected.length);
	actual.forEach((b, k) => {
		expect(b.pairs, `bin ${k} pairs`).toBe(expected[k].pairs);
		if (expected[k].pairs === 0) {
			expect(b.gamma).toBeNaN();
			expect(b.h).toBe(expected[k].h);
		} else {
			expectRelClose(b.h, expected[k].h, 1e-12, `bin ${k} h`);
			expectRelClose(b.gamma, expected[k].gamma, 1e-12, `bin ${k} gamma`);
		}
	});
}

describe('computeVariograms(prepared, settings)', () => {
	const data = handDomain();
	const prepared = prepareSamples(data, settings);

	it('computeVariograms gives the bins of one experimentalVariogram call per direction, in any chunk size', async () => {
		const vDirect = experimentalVariogram(prepared.samples, { direction: 'vertical', lag: 0.1, nLags: 20, lagTolerance: 0.05 });
		const hDirect = experimentalVariogram(prepared.samples, { direction: 'horizontal', lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1 });
		expect(vDirect.some((b) => b.pairs > 0) && hDirect.some((b) => b.pairs > 0)).toBe(true);
		for (const chunkSize of [1, 37, 160, 500, 100_000]) {
			const r = await computeVariograms(prepared, settings, { chunkSize, pause: async () => {} });
			expectSameBins(r.vertical, vDirect);
			expectSameBins(r.horizontal, hDirect);
		}
	});

	it('computeVariograms with an azimuth gives the directional horizontal bins of experimentalVariogram', async () => {
		// A 3D layout: the same soundings spread in plan, so the azimuth filter removes pairs.
		const d3 = handDomain({ seed: '3d' });
		d3.samples.y = d3.samples.x.map((x, i) => (d3.samples.sounding[i].charCodeAt(3) % 3) * 11 + x * 0.3);
		const p = prepareSamples(d3, settings);
		const s: VariogramSettings = { ...settings, horizontal: { ...settings.horizontal, azimuth: 70, angleTolerance: 15 } };
		const direct = experimentalVariogram(p.samples, {
			direction: 'horizontal', lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1, azimuth: 70, angleTolerance: 15
		});
		const omni = experimentalVariogram(p.samples, { direction: 'horizontal', lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1 });
		expect(direct.reduce((a, b) => a + b.pairs, 0)).toBeLessThan(omni.reduce((a, b) => a + b.pairs, 0));
		const r = await computeVariograms(p, s, { chunkSize: 90, pause: async () => {} });
		expectSameBins(r.horizontal, direct);
		// Across the azimuth: the engine's bins at azimuth + 90°.
		const across = experimentalVariogram(p.samples, {
			direction: 'horizontal', lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1, azimuth: 160, angleTolerance: 15
		});
		expectSameBins(r.horizontalMinor!, across);
		expect(r.map).toBeNull();
	});

	it('computeVariograms with map gives experimentalVariogramMap\'s cells in any chunk size (pairs exact, γ to 1e-12)', async () => {
		const d3 = handDomain({ seed: 'map' });
		d3.samples.y = d3.samples.x.map((x, i) => (d3.samples.sounding[i].charCodeAt(3) % 3) * 11 + x * 0.3);
		const p = prepareSamples(d3, settings);
		const direct = experimentalVariogramMap(p.samples, { lag: 7.5, nLags: 12, verticalBand: 0.1 });
		for (const chunkSize of [90, 500, 100_000]) {
			const r = await computeVariograms(p, settings, { chunkSize, pause: async () => {}, map: true });
			const m = r.map!;
			expect(m.size).toBe(direct.size);
			expect(Array.from(m.pairs)).toEqual(Array.from(direct.pairs));
			for (let c = 0; c < m.pairs.length; c++) {
				if (m.pairs[c] === 0) expect(m.gamma[c]).toBeNaN();
				else expectRelClose(m.gamma[c], direct.gamma[c], 1e-12, `cell ${c}`);
			}
		}
	});

	it('computeVariograms reports progress from 0 to total, once per chunk, in order', async () => {
		const seen: { done: number; total: number; stage: string }[] = [];
		await computeVariograms(prepared, settings, { chunkSize: 320, onProgress: (p) => seen.push(p), pause: async () => {} });
		// 8 soundings × 160 readings: 4 vertical groups of 2 soundings, 4 z-slabs of 320 samples.
		expect(seen.map((p) => p.done)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8]);
		expect(new Set(seen.map((p) => p.total))).toEqual(new Set([8]));
		expect(seen.at(-1)!.stage).toBe('horizontal');
		expect(seen[1].stage).toBe('vertical');
	});

	it('computeVariograms stops with a CancelledError at the next chunk once cancelled', async () => {
		let chunks = 0;
		let cancel = false;
		const run = computeVariograms(prepared, settings, {
			chunkSize: 160,
			onProgress: (p) => {
				chunks = p.done;
				if (p.done === 2) cancel = true;
			},
			isCancelled: () => cancel
		});
		await expect(run).rejects.toBeInstanceOf(CancelledError);
		expect(chunks).toBe(2);
	});

	it('computeVariograms returns the variance of the analysed values: raw, or normal scores with weights', async () => {
		const raw = await computeVariograms(prepared, settings, { pause: async () => {} });
		expect(raw.variance).toBe(weightedVariance(data.samples.value));
		const ns = prepareSamples(data, { transform: 'normal-score', declustered: true });
		const expected = normalScore(data.samples.value, data.weights).scores;
		expect(ns.samples.map((s) => s.value)).toEqual(Array.from(expected));
		expect(ns.variance).toBe(weightedVariance(expected, data.weights));
		// Weighted normal scores have mean ≈ 0 and variance ≈ 1 (midpoint rule; 1e-2 for n = 1280, common practice).
		expect(Math.abs(ns.mean)).toBeLessThan(1e-2);
		expect(Math.abs(ns.variance - 1)).toBeLessThan(1e-2);
	});

	it('computeVariograms rejects bad settings before any chunk runs (the engine\'s RangeError)', async () => {
		let calls = 0;
		const bad = { ...settings, vertical: { ...settings.vertical, lag: 0 } };
		await expect(computeVariograms(prepared, bad, { onProgress: () => calls++ })).rejects.toThrow(RangeError);
		expect(calls).toBe(0);
	});

	it('computeVariograms of one sounding has no horizontal pairs', async () => {
		const one = handDomain({ soundings: 1 });
		const s = { ...settings, vertical: { lag: 0.05, nLags: 4, lagTolerance: 0.02 } };
		const r = await computeVariograms(prepareSamples(one, s), s, { pause: async () => {} });
		expect(r.horizontal.every((b) => b.pairs === 0 && Number.isNaN(b.gamma))).toBe(true);
		// 160 readings 0.05 m apart: 159 neighbouring pairs at the first lag, 158 at the second.
		expect(r.vertical.slice(0, 2).map((b) => b.pairs)).toEqual([159, 158]);
	});
});

describe('prepareSamples(data, settings)', () => {
	it('prepareSamples rejects empty and ragged columns', () => {
		const d = handDomain({ soundings: 1, readings: 3 });
		expect(() => prepareSamples({ ...d, samples: { x: [], y: [], z: [], value: [], sounding: [] } }, settings)).toThrow('no samples');
		expect(() => prepareSamples({ ...d, samples: { ...d.samples, z: [1] } }, settings)).toThrow(RangeError);
		expect(() => prepareSamples({ ...d, weights: [1] }, { transform: 'none', declustered: true })).toThrow('weights must match the samples');
		expect(() => prepareSamples({ weights: [] } as never, settings)).toThrow(TypeError);
	});

	it("prepareSamples with a trend analyses the residuals of fitLinearTrend (declustered weights), then their normal scores", () => {
		const d = handDomain({ soundings: 4, readings: 30 });
		const p = prepareSamples(d, { transform: 'normal-score', declustered: true, trend: 'elevation' });
		const samples = d.samples.value.map((value, i) => ({ x: d.samples.x[i], y: d.samples.y[i], z: d.samples.z[i], value }));
		const fit = fitLinearTrend(samples, d.weights, 'elevation');
		expect(p.trend).toEqual(fit);
		const scores = normalScore(trendResiduals(samples, fit.trend), d.weights).scores;
		expect(p.samples.map((s) => s.value)).toEqual(Array.from(scores));
		const raw = prepareSamples(d, { transform: 'none', declustered: false, trend: 'elevation-plan' });
		expect(raw.trend!.used).toEqual({ x: true, y: false, z: true });
		expect(raw.variance).toBe(weightedVariance(trendResiduals(samples, raw.trend!.trend)));
		expect(prepareSamples(d, { transform: 'none', declustered: false }).trend).toBeNull();
		// domainTrend gives the same trend a simulation must add back (the one removed here).
		expect(domainTrend(d, { declustered: true, trend: 'elevation' })).toEqual(fit);
		expect(domainTrend(d, { declustered: false, trend: 'elevation-plan' })).toEqual(raw.trend);
		expect(domainTrend(d, { declustered: true, trend: 'none' })).toBeNull();
	});

	it('prepareSamples does not mutate its input', () => {
		const d = handDomain({ soundings: 2, readings: 10 });
		const copy = structuredClone(d);
		prepareSamples(d, { transform: 'normal-score', declustered: true });
		expect(d).toEqual(copy);
	});
});
