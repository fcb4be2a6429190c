import { describe, it, expect, afterAll } from 'vitest';
import { createNodePool } from '../../workers/node-pool';
import { CancelledError } from '../../src/lib/cancelled-error';
import { simulate, canonicalJson, createRecipe, parseRecipeDocument, regenerate, ENGINE_VERSION } from '../../src/lib/geostat/index';
import { RealizationPool, type PoolWorker } from '../../workers/realization-pool';
import { ensembleMap } from '../../src/lib/ensemble/index';
import type { Recipe } from '../../src/lib/geostat/index';
import { expectSameBits } from '../asserts';
import { input, section } from './fixtures';

describe('createNodePool (worker_threads + comlink node adapter)', () => {
	const pool = createNodePool({ size: 2 });
	afterAll(() => pool.close());

	it('pool.run gives each realization bit-identical to simulate(input, targets, r) in this thread, with progress to (total, total)', async () => {
		const t = section(40, 12);
		const calls: [number, number][] = [];
		const res = await pool.run(input, t, [0, 5, 17, 3], { onProgress: (d, tot) => calls.push([d, tot]) });
		expect([...res.keys()].sort((a, b) => a - b)).toEqual([0, 3, 5, 17]);
		for (const r of [0, 3, 5, 17]) expectSameBits(res.get(r)!, simulate(input, t, r), `realization ${r}`);
		expect(calls.length).toBeGreaterThan(4);
		for (let i = 1; i < calls.length; i++) expect(calls[i][0]).toBeGreaterThanOrEqual(calls[i - 1][0]);
		expect(calls[calls.length - 1]).toEqual([4 * 480, 4 * 480]);
	}, 60_000);

	it('pool.cancel() rejects the run with CancelledError, and the pool runs again afterwards', async () => {
		const big = section(200, 40);
		let cancelledAt = -1;
		const run = pool.run(input, big, [0, 1, 2, 3, 4, 5], {
			onProgress: (d) => {
				if (cancelledAt < 0) {
					cancelledAt = d;
					pool.cancel();
				}
			}
		});
		await expect(run).rejects.toBeInstanceOf(CancelledError);
		expect(cancelledAt).toBeGreaterThan(0);
		const again = await pool.run(input, section(40, 12), [1]);
		expectSameBits(again.get(1)!, simulate(input, section(40, 12), 1));
	}, 60_000);

	it('pool.run honours an AbortSignal and rejects bad realization numbers', async () => {
		const ac = new AbortController();
		const run = pool.run(input, section(200, 40), [0, 1, 2], { signal: ac.signal, onProgress: () => ac.abort() });
		await expect(run).rejects.toThrow('cancelled');
		await expect(pool.run(input, section(4, 1), [-1])).rejects.toThrow(RangeError);
		expect((await pool.run(input, section(4, 1), [])).size).toBe(0);
	}, 60_000);

	it('pool.runRecipe gives the bits of regenerate(recipe, r) and rejects a recipe of another engine version', async () => {
		const recipe = createRecipe(input, { kind: 'grid', origin: { x: 0, y: 0, z: -3 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 30, y: 1, z: 12 }, domainRuns: [[0, 360]] });
		const res = await pool.runRecipe(recipe, [0, 6]);
		for (const r of [0, 6]) expectSameBits(res.get(r)!, regenerate(recipe, r), `realization ${r}`);
		expect(ENGINE_VERSION).not.toBe('conefield-sgs/0');
		await expect(pool.runRecipe({ ...recipe, engineVersion: 'conefield-sgs/0' }, [0])).rejects.toThrow('recipe is from engine version conefield-sgs/0');
	}, 60_000);

	it('pool.call runs an ensemble map on a worker with the bits of ensembleMap in this thread; refused during a run', async () => {
		const recipe = createRecipe(input, { kind: 'grid', origin: { x: 0, y: 0, z: -3 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 30, y: 1, z: 12 }, domainRuns: [[0, 360]] }, { realizations: 5 });
		const res = await pool.runRecipe(recipe, [0, 1, 2, 3, 4]);
		const ordered = [0, 1, 2, 3, 4].map((r) => res.get(r)!);
		for (const stat of ['mean', 'sd', 'p10', 'below'] as const) {
			expectSameBits(await pool.call((w) => w.ensembleMap(ordered, stat, 14)), ensembleMap(ordered, stat, 14), stat);
		}
		const running = pool.runRecipe(recipe, [0, 1]);
		await expect(pool.call((w) => w.ensembleMap(ordered, 'mean'))).rejects.toThrow('a run is already in progress');
		await running;
	}, 60_000);

	it('a worker that cannot load rejects the run instead of leaving it waiting', async () => {
		const broken = createNodePool({ size: 1, workerUrl: new URL('file:///nonexistent/conefield-simulation-worker.mjs') });
		await expect(broken.run(input, section(4, 1), [0])).rejects.toThrow();
		await broken.close();
	}, 60_000);
});

describe('RealizationPool.runRecipe with a key (a worker keeps its prepared recipe)', () => {
	const pool = createNodePool({ size: 1 });
	afterAll(() => pool.close());

	it('prepares once for runs under the same key, again for another key, with the same bits as regenerate()', async () => {
		const t = { kind: 'grid' as const, origin: { x: 0, y: 0, z: -3 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 30, y: 1, z: 12 }, domainRuns: [[0, 360]] as [number, number][] };
		const a = createRecipe(input, t, { realizations: 6 });
		const b = createRecipe({ ...input, seed: 'pool-b' }, t, { realizations: 6 });
		const prepares: number[] = [];
		const spy = (recipe: typeof a, key: string, list: number[]) =>
			pool.runRecipe(recipe, list, { key, onProgress: (d) => d === 0 && prepares.push(1) });
		const first = await spy(a, 'A', [0, 1]);
		const [w] = (pool as unknown as { workers: { remote: { preparedAs(k: string): Promise<number> } }[] }).workers;
		expect(await w.remote.preparedAs('A')).toBe(360);
		expect(await w.remote.preparedAs('B')).toBe(-1);
		const second = await spy(a, 'A', [5, 2]);
		expect(await w.remote.preparedAs('A')).toBe(360);
		const other = await spy(b, 'B', [2]);
		expect(await w.remote.preparedAs('A')).toBe(-1);
		expect(await w.remote.preparedAs('B')).toBe(360);
		for (const [r, v] of [...first, ...second]) expectSameBits(v, regenerate(a, r), `A realization ${r}`);
		expectSameBits(other.get(2)!, regenerate(b, 2), 'B realization 2');
		expect(ENGINE_VERSION).toBe(a.engineVersion);
	}, 60_000);
});

describe('RealizationPool.warm', () => {
	it('starts the pool’s workers and warms each once; a run then uses them; a failing warm-up is let go', async () => {
		const warmed: number[] = [];
		let spawned = 0;
		const standIn = (): PoolWorker => {
			const id = spawned++;
			return {
				remote: {
					warm: async () => (id === 1 ? Promise.reject(new Error('no room')) : (warmed.push(id), 480)),
					prepareRecipe: async () => 1,
					realize: async (r: number) => Float64Array.of(r)
				} as unknown as PoolWorker['remote'],
				terminate: () => undefined
			};
		};
		const pool = new RealizationPool(standIn, 3);
		await pool.warm();
		expect(spawned).toBe(3);
		expect(warmed).toEqual([0, 2]);
		await pool.warm();
		expect(spawned).toBe(3);
		const got = await pool.runRecipe({} as Recipe, [0, 1, 2, 3]);
		expect([...got.keys()].sort()).toEqual([0, 1, 2, 3]);
		expect(spawned).toBe(3);
		expect(warmed).toEqual([0, 2]);
	});

	it('real workers warmed up give the bits of regenerate()', async () => {
		const pool = createNodePool({ size: 2 });
		try {
			await pool.warm();
			const recipe = createRecipe(input, { kind: 'grid', origin: { x: 0, y: 0, z: -3 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 30, y: 1, z: 12 }, domainRuns: [[0, 360]] }, { realizations: 4 });
			const got = await pool.runRecipe(recipe, [0, 1, 2, 3]);
			for (const r of [0, 1, 2, 3]) expectSameBits(got.get(r)!, regenerate(recipe, r), `realization ${r}`);
		} finally {
			await pool.close();
		}
	}, 60_000);
});

describe('RealizationPool.runRecipe without a key', () => {
	it('a worker that makes one realization keeps nothing per target for a next one; with more to make it keeps it', async () => {
		const asked: unknown[] = [];
		const standIn = (): PoolWorker => ({
			remote: {
				prepareRecipe: async (_r: unknown, _key: unknown, options: unknown) => (asked.push(options), 1),
				realize: async (r: number) => Float64Array.of(r)
			} as unknown as PoolWorker['remote'],
			terminate: () => undefined
		});
		const pool = new RealizationPool(standIn, 2);
		const recipe = {} as Recipe;
		await pool.runRecipe(recipe, [4]);
		expect(asked).toEqual([{ keepPerTarget: false }]);
		asked.length = 0;
		await pool.runRecipe(recipe, [0, 1]);
		expect(asked).toEqual([{ keepPerTarget: false }, { keepPerTarget: false }]);
		asked.length = 0;
		await pool.runRecipe(recipe, [0, 1, 2]);
		expect(asked).toEqual([undefined, undefined]);
	});

	it('a mesh recipe whose columns are shared with the workers (SharedArrayBuffer) realizes the bits of regenerate()', async () => {
		const pool = createNodePool({ size: 2 });
		try {
			const t = section(24, 10);
			// Off the lattice: nudged x, so the engine's general path (the one a mesh takes) runs.
			const x = Array.from(t.x, (v, i) => v + (i % 3) * 0.013);
			const recipe = createRecipe(input, { kind: 'points', x, y: Array.from(t.y), z: Array.from(t.z), domain: Array.from(t.domain) }, { realizations: 3 });
			const shared = parseRecipeDocument(canonicalJson(recipe), { shared: true });
			expect((shared.targets as { x: Float64Array }).x.buffer).toBeInstanceOf(SharedArrayBuffer);
			const got = await pool.runRecipe(shared, [0, 1, 2]);
			for (const r of [0, 1, 2]) expectSameBits(got.get(r)!, regenerate(recipe, r), `realization ${r}`);
			expect(Array.from((shared.targets as { x: Float64Array }).x)).toEqual(x);
		} finally {
			await pool.close();
		}
	}, 60_000);
});
