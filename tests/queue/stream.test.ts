/**
 * QueueRealizations.stream against a real redis-server and a worker process from the built entry: realizations in
 * the order asked with regenerate()'s bits, a bounded window (Redis never holds more than the window's realizations
 * however slowly they are read), an early stop that leaves nothing behind, and the two ways it fails loudly: no worker
 * alive, and Redis not answering.
 */
import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRecipe, regenerate, type Recipe, type SimulationInput } from '../../src/lib/geostat/index';
import { QueueFailure, QueueRealizations } from '../../src/lib/server/queue/realizations';
import { rangeSize } from '../../src/lib/server/queue/protocol';
import { freePort } from '../setup/server';
import { startRedis, startWorker, stopAll, type TestRedis } from '../setup/queue';
import { expectSameBits } from '../asserts';

const input: SimulationInput = {
	seed: 'queue-stream',
	domains: [
		{
			samples: [
				{ x: 3, y: 0, z: -0.5, value: 12, sounding: 'A' },
				{ x: 60, y: 0, z: -1, value: 20, sounding: 'B' },
				{ x: 60, y: 0, z: -3.25, value: 15, sounding: 'B' }
			],
			model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1 }] },
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 8, maxSimulated: 12 }
		}
	]
};
// 100 × 50 = 5,000 cells: four realizations a range.
const recipe: Recipe = createRecipe(input, { kind: 'grid', origin: { x: 0, y: 0, z: -12.25 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 100, y: 1, z: 50 }, domainRuns: [[0, 5000]] }, { realizations: 16 });

let redis: TestRedis;
let client: Redis;
let queue: QueueRealizations;

beforeAll(async () => {
	redis = await startRedis();
	client = new Redis(redis.url, { maxRetriesPerRequest: null });
	await startWorker(redis.url, 'only');
	queue = new QueueRealizations(redis.url);
	while ((await queue.workers()).length < 1) await new Promise((r) => setTimeout(r, 50));
}, 60_000);

afterAll(async () => {
	await queue?.close();
	client?.disconnect();
	await stopAll();
});

describe('QueueRealizations.stream(recipe, list)', () => {
	it('yields the realizations in the order asked, each with regenerate()’s bits', async () => {
		const list = [9, 2, 15, 3, 0];
		const got: number[] = [];
		for await (const [r, values] of queue.stream({ recipe }, list)) {
			got.push(r);
			expectSameBits(values, regenerate(recipe, r), `realization ${r}`);
		}
		expect(got).toEqual(list);
	});

	it('read slowly, Redis never holds more than the window (2 ranges of 4 for one thread) of the run’s realizations', async () => {
		expect(rangeSize(5000)).toBe(4);
		const list = Array.from({ length: 16 }, (_, r) => r);
		let most = 0;
		const progress: number[] = [];
		const got: number[] = [];
		for await (const [r] of queue.stream({ recipe }, list, { onProgress: (d, t) => progress.push(d / t) })) {
			got.push(r);
			await new Promise((res) => setTimeout(res, 150));
			most = Math.max(most, (await client.keys('conefield:out:*')).length);
		}
		expect(got).toEqual(list);
		expect(most).toBeGreaterThan(0);
		expect(most).toBeLessThanOrEqual(8);
		expect(progress.at(-1)).toBe(1);
		for (let k = 1; k < progress.length; k++) expect(progress[k]).toBeGreaterThanOrEqual(progress[k - 1] - 1e-12);
		expect(await client.keys('conefield:run:*')).toEqual([]);
	});

	it('stopped early, it ends its run and leaves no results and no waiting jobs behind', async () => {
		let n = 0;
		for await (const _ of queue.stream({ recipe }, Array.from({ length: 16 }, (_, r) => r))) if (++n === 3) break;
		const deadline = Date.now() + 10_000;
		for (;;) {
			const state = await queue.state();
			const left = (await client.keys('conefield:out:*')).length + (await client.keys('conefield:run:*')).length;
			if ((state.waiting === 0 && state.active === 0 && left === 0) || Date.now() > deadline) {
				expect({ waiting: state.waiting, active: state.active, left }).toEqual({ waiting: 0, active: 0, left: 0 });
				break;
			}
			await new Promise((r) => setTimeout(r, 100));
		}
	});

	it('fails loudly when no worker is alive (a Redis no worker serves)', async () => {
		const lonely = await startRedis();
		const q = new QueueRealizations(lonely.url, { noWorkerMs: 2000, pollMs: 200 });
		try {
			const run = async () => {
				for await (const _ of q.stream({ recipe }, [0])) return;
			};
			await expect(run()).rejects.toThrow(/^No worker of the realization queue has been seen for 2 s: start one with `npm run worker`/);
			await expect(run()).rejects.toBeInstanceOf(QueueFailure);
		} finally {
			await q.close();
			await lonely.stop();
		}
	}, 30_000);

	it('fails loudly, naming the address without its password, when Redis does not answer within the grace', async () => {
		const port = await freePort();
		const q = new QueueRealizations(`redis://:secret@127.0.0.1:${port}`, { graceMs: 1000 });
		try {
			const run = async () => {
				for await (const _ of q.stream({ recipe }, [0])) return;
			};
			await expect(run()).rejects.toThrow(`Redis at redis://127.0.0.1:${port} did not answer for 1 s, so the work stopped`);
		} finally {
			await q.close();
		}
	}, 30_000);
});
