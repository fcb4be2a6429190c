// The Simulations page's state classes, driven as the page drives them, with the engine run in this thread (a pool
// that realizes with prepareRecipe, the ensemble functions called directly), so every value is the engine's.
import { describe, expect, it } from 'vitest';
import type { RecipeView } from '../../../../../src/lib/api/index';
import { createRecipe, prepareRecipe, regenerate, type Recipe, type SimulationInput } from '../../../../../src/lib/geostat/index';
import { checkRealizations, ensembleMap } from '../../../../../src/lib/ensemble/index';
import { CancelledError } from '../../../../../src/lib/cancelled-error';
import { EnsembleRun, PROGRESS_INTERVAL_MS, RATE_WINDOW_MS, type RunPool } from '../../../../../src/routes/projects/[id]/simulations/run.svelte';
import { FieldViewer, type EnsembleEngine } from '../../../../../src/routes/projects/[id]/simulations/viewer.svelte';
import { expectSameBits } from '../../../../asserts';

const model = { azimuth: 90, structures: [{ type: 'exponential' as const, sill: 1, rangeMajor: 12, rangeMinor: 12, rangeVertical: 1.5 }] };
const input: SimulationInput = {
	seed: 'page',
	domains: [
		{ samples: [{ x: 3, y: 0, z: -1, value: 60, sounding: 'A' }, { x: 20, y: 0, z: -1.5, value: 90, sounding: 'B' }, { x: 20, y: 0, z: -1, value: 75, sounding: 'B' }], model, transform: 'normal-score', kriging: 'simple', search: { maxData: 8, maxSimulated: 8 } },
		{ samples: [{ x: 3, y: 0, z: -2.5, value: 0.3, sounding: 'A' }, { x: 20, y: 0, z: -2.6, value: 0.25, sounding: 'B' }], model, transform: 'normal-score', kriging: 'simple', search: { maxData: 8, maxSimulated: 8 } }
	]
};
// 30 × 12 cells: the top 4 rows are domain 0 (sand, 120 cells), the 8 below domain 1 (clay, 240 cells).
const recipe: Recipe = createRecipe(
	input,
	{ kind: 'grid', origin: { x: 0.5, y: 0, z: -2.875 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 30, y: 1, z: 12 }, domainRuns: [[1, 240], [0, 120]] },
	{ realizations: 4 }
);
const view = {
	id: 'r1',
	realizations: 4,
	provenance: {
		domains: [
			{ domainId: 'd0', name: 'Sand', property: 'qc1Ncs', index: 0, cells: 120, tails: { zmin: 60, zmax: 90 } },
			{ domainId: 'd1', name: 'Clay', property: 'suRatio', index: 1, cells: 240, tails: { zmin: 0.25, zmax: 0.3 } }
		]
	}
} as unknown as RecipeView;

/** A pool that realizes in this thread, one realization a macrotask, so cancel can come in between. */
function threadPool(): RunPool & { runs: number } {
	let cancelled = false;
	const pool = {
		runs: 0,
		async runRecipe(r: Recipe, list: number[], opts: { onProgress?: (d: number, t: number) => void; onRealization?: (k: number, v: Float64Array) => void }) {
			pool.runs++;
			cancelled = false;
			const prepared = prepareRecipe(r);
			const out = new Map<number, Float64Array>();
			for (const [i, k] of list.entries()) {
				await new Promise((done) => setTimeout(done, 1));
				if (cancelled) throw new CancelledError();
				const v = prepared.realize(k);
				out.set(k, v);
				opts.onProgress?.((i + 1) * prepared.active, list.length * prepared.active);
				opts.onRealization?.(k, v);
			}
			return out;
		},
		cancel: () => {
			cancelled = true;
		},
		close: async () => undefined
	};
	return pool;
}

const engine: EnsembleEngine = {
	ensembleMap: async (rs, stat, t) => ensembleMap(rs, stat, t),
	checks: async (r, rs, opts) => checkRealizations(r, rs, opts),
	terminate: () => undefined
};

describe('EnsembleRun', () => {
	it('run() makes the N realizations with the engine’s bits, progress to 1, first and last times; a second run() does nothing', async () => {
		const pool = threadPool();
		let clock = 0;
		const run = new EnsembleRun(recipe, () => pool, () => (clock += 10));
		await run.run();
		expect(run.status).toBe('done');
		expect(run.count).toBe(4);
		expect(run.fraction).toBe(1);
		for (let k = 0; k < 4; k++) expectSameBits(run.results.get(k)!, regenerate(recipe, k), `realization ${k}`);
		expect(run.firstAt).toBeGreaterThan(0);
		expect(run.lastAt).toBeGreaterThanOrEqual(run.firstAt!);
		await run.run();
		expect(pool.runs).toBe(1);
		expect(run.all()!.length).toBe(4);
	});

	it('cancel() stops the run, keeps what was made, and the next run() makes only the rest', async () => {
		const pool = threadPool();
		const run = new EnsembleRun(recipe, () => pool);
		const going = run.run();
		await new Promise((done) => setTimeout(done, 3));
		run.cancel();
		await going;
		expect(run.status).toBe('cancelled');
		const kept = run.count;
		expect(kept).toBeLessThan(4);
		expect(run.message).toBe(`Cancelled: ${kept} of 4 realizations are kept.`);
		expect(run.all()).toBeNull();
		await run.run();
		expect(run.status).toBe('done');
		expect(run.count).toBe(4);
	});

	it('progress reaches the page at most every PROGRESS_INTERVAL_MS, and always when all is done', async () => {
		let clock = 0;
		const seen: number[] = [];
		let run: EnsembleRun;
		// 40 reports 10 ms apart (as a worker's hundred a realization would come), then the last.
		const chatty: RunPool = {
			runRecipe: async (_r, _list, opts) => {
				for (let i = 1; i <= 40; i++) {
					opts.onProgress?.(i, 41);
					seen.push(run.done);
				}
				opts.onProgress?.(41, 41);
				seen.push(run.done);
				return new Map();
			},
			cancel: () => undefined,
			close: async () => undefined
		};
		run = new EnsembleRun(recipe, () => chatty, () => (clock += 10));
		await run.run();
		// The clock reads 10 at the start, then 20, 30, … at each report: shown at 20 ms, then every 250 ms after it.
		expect(new Set(seen)).toEqual(new Set([1, 26, 41]));
		expect(seen.slice(0, 25).every((d) => d === 1)).toBe(true);
		expect(run.fraction).toBe(1);
		expect(PROGRESS_INTERVAL_MS).toBe(250);
	});

	it('time left goes by the rate since the first realization arrived, not since the start', async () => {
		let clock = 0;
		const lefts: (number | null)[] = [];
		let run: EnsembleRun;
		// Ten realizations of five reports each: the first takes 1.5 s (a worker's first is slow), the others 0.3 s.
		const warming: RunPool = {
			runRecipe: async (_r, _list, opts) => {
				for (let k = 0; k < 10; k++) {
					for (let s = 1; s <= 5; s++) {
						clock += k === 0 ? 300 : 60;
						opts.onProgress?.(5 * k + s, 50);
					}
					opts.onRealization?.(k, new Float64Array(1));
					lefts.push(run.left);
				}
				return new Map();
			},
			cancel: () => undefined,
			close: async () => undefined
		};
		run = new EnsembleRun(recipe, () => warming, () => clock);
		await run.run();
		// Timed from the start, at 20 % the estimate would be 1.8 s · 0.8 / 0.2 = 7.2 s; 8 × 0.3 s = 2.4 s are left.
		expect(lefts[1]).toBeCloseTo(2400, 6);
		for (let k = 1; k < 9; k++) expect(lefts[k]).toBeCloseTo(300 * (9 - k), 6);
		expect(run.left).toBeNull();
	});

	it('once the recent progress is all at the steady rate, time left is the rest at that rate (RATE_WINDOW_MS)', async () => {
		let clock = 0;
		const checks: [number, number, number][] = [];
		let run: EnsembleRun;
		// Ten realizations of five reports: two slow ones (1.5 s each: two workers' first), then 0.5 s each.
		const settling: RunPool = {
			runRecipe: async (_r, _list, opts) => {
				for (let k = 0; k < 10; k++) {
					for (let s = 1; s <= 5; s++) {
						clock += k < 2 ? 300 : 100;
						opts.onProgress?.(5 * k + s, 50);
						if (run.left !== null && run.fraction < 1) checks.push([clock, run.fraction, run.left]);
					}
					opts.onRealization?.(k, new Float64Array(1));
				}
				return new Map();
			},
			cancel: () => undefined,
			close: async () => undefined
		};
		run = new EnsembleRun(recipe, () => settling, () => clock);
		await run.run();
		// From 3 s on the run does 1 % in 50 ms: what is left takes (1 − f) · 5 s. Since the first realization (at
		// 1.5 s) the rate would still count the second slow one: at 6 s, 4.5 s · 0.2 / 0.7 = 1.29 s instead of 1 s.
		const steady = checks.filter(([t]) => t >= 3000 + RATE_WINDOW_MS + PROGRESS_INTERVAL_MS + 100);
		expect(steady.length).toBeGreaterThan(3);
		for (const [, f, left] of steady) expect(left).toBeCloseTo((1 - f) * 5000, 6);
	});

	it('warm() starts the pool ahead of the run (once), and not when all realizations are made', async () => {
		const pool = threadPool();
		let warms = 0;
		let starts = 0;
		const warming = Object.assign(pool, { warm: async () => void warms++ });
		const run = new EnsembleRun(recipe, () => (starts++, warming));
		run.warm();
		expect([starts, warms]).toEqual([1, 1]);
		await run.run();
		expect([starts, pool.runs, run.count]).toEqual([1, 1, 4]);
		run.warm();
		expect(warms).toBe(1);
	});

	it('a pool error is shown as the run’s message', async () => {
		const failing: RunPool = { runRecipe: async () => Promise.reject(new Error('the simulation worker stopped (exit 1)')), cancel: () => undefined, close: async () => undefined };
		const run = new EnsembleRun(recipe, () => failing);
		await run.run();
		expect([run.status, run.message]).toEqual(['failed', 'the simulation worker stopped (exit 1)']);
	});
});

describe('FieldViewer', () => {
	it('orders the properties by cells, wraps realization numbers, and shows nothing until a realization is made', () => {
		const v = new FieldViewer(view, recipe, new EnsembleRun(recipe, threadPool), engine);
		expect(v.properties).toEqual(['suRatio', 'qc1Ncs']);
		expect(v.property).toBe('suRatio');
		v.show(-1);
		expect(v.realization).toBe(3);
		v.show(9);
		expect(v.realization).toBe(1);
		expect(v.values).toBeNull();
		expect(v.propertyOf(0)).toBe('suRatio');
		expect(v.propertyOf(359)).toBe('qc1Ncs');
	});

	it('ensemble maps wait for all N, then equal ensembleMap over the realizations in order', async () => {
		const run = new EnsembleRun(recipe, threadPool);
		const v = new FieldViewer(view, recipe, run, engine);
		await v.showMap('mean');
		expect(v.mapStatus).toBe('Ensemble maps need all 4 realizations: run the rest first.');
		expect(v.values).toBeNull();
		await run.run();
		await v.showMap('mean');
		expectSameBits(v.values!, ensembleMap(run.all()!, 'mean'));
		expect(v.scaleLabel).toBe('Mean (E-type) of su/σ′v');
	});

	it('P(below) asks for a threshold, then maps it on [0, 1] with the unit in its label', async () => {
		const run = new EnsembleRun(recipe, threadPool);
		await run.run();
		const v = new FieldViewer(view, recipe, run, engine);
		v.property = 'qc1Ncs';
		await v.showMap('below');
		expect(v.mapStatus).toMatch(/^Type a threshold/);
		await v.setThreshold(75);
		expectSameBits(v.values!, ensembleMap(run.all()!, 'below', 75));
		expect(v.span).toEqual([0, 1]);
		expect(v.scaleLabel).toBe('P(qc1Ncs < 75)');
	});

	it('the colour span of values is the 1st–99th percentile of the property’s data; the profile’s is the tails', () => {
		const v = new FieldViewer(view, recipe, new EnsembleRun(recipe, threadPool), engine);
		v.property = 'qc1Ncs';
		const [lo, hi] = v.valueSpan;
		expect(lo).toBeGreaterThanOrEqual(60);
		expect(hi).toBeLessThanOrEqual(90);
		expect(v.tailSpan).toEqual([60, 90]);
	});

	it('runChecks checks the realizations made, one check per domain', async () => {
		const run = new EnsembleRun(recipe, threadPool);
		const v = new FieldViewer(view, recipe, run, engine);
		await v.runChecks();
		expect(v.checksStatus).toBe('Run realizations first.');
		await run.run([0, 1]);
		await v.runChecks();
		expect(v.checks!.map((c) => [c.domain, c.realizations])).toEqual([
			[0, 2],
			[1, 2]
		]);
		expect(v.checksStatus).toBe('Checked 2 of 4 realizations.');
	});
});
