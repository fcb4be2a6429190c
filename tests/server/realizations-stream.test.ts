// streamRealizations on a pool of stand-in workers (each realization a short wait): order kept whatever the
// completion order, at most `ahead` realizations made before they are taken (backpressure), a consumer that stops
// early stops the work and leaves the queue free, an abort stops a batch that is running (its workers terminated),
// and a reader that stalls holds back only its own stream, never the pool.
import { afterAll, describe, expect, it } from 'vitest';
import { RealizationPool, type PoolWorker } from '../../workers/realization-pool';
import { runRealizations, stopRealizations, streamRealizations, useRealizationPool } from '../../src/lib/server/realizations';
import type { Recipe } from '../../src/lib/geostat/index';

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));
const started: number[] = [];
let terminated = 0;

function standIn(): PoolWorker {
	return {
		remote: {
			prepareRecipe: async () => 1,
			preparedAs: async () => -1,
			// Later numbers finish sooner, so completion order differs from the order asked.
			realize: async (r: number) => {
				started.push(r);
				await wait(Math.max(1, 30 - r));
				return Float64Array.of(r);
			}
		} as unknown as PoolWorker['remote'],
		terminate: () => {
			terminated++;
		}
	};
}

const recipe = {} as Recipe;

describe('streamRealizations(recipe, list, { ahead })', () => {
	useRealizationPool(new RealizationPool(standIn, 2));
	afterAll(() => stopRealizations());

	it('yields the realizations in the order asked', async () => {
		started.length = 0;
		const got: number[] = [];
		for await (const [r, values] of streamRealizations(recipe, [5, 3, 9, 1])) {
			expect(values[0]).toBe(r);
			got.push(r);
		}
		expect(got).toEqual([5, 3, 9, 1]);
	});

	it('makes at most `ahead` realizations beyond those taken (a slow reader holds the workers back)', async () => {
		started.length = 0;
		let taken = 0;
		for await (const _ of streamRealizations(recipe, Array.from({ length: 8 }, (_, r) => r), { ahead: 2 })) {
			taken++;
			await wait(40);
			expect(started.length).toBeLessThanOrEqual(taken + 2);
		}
		expect(taken).toBe(8);
	});

	it('stops when the reader stops early: few realizations started, none later, the queue free again', async () => {
		started.length = 0;
		for await (const [r] of streamRealizations(recipe, Array.from({ length: 20 }, (_, r) => r))) {
			expect(r).toBe(0);
			break;
		}
		expect(started.length).toBeLessThanOrEqual(3);
		await wait(100);
		expect(started.length).toBeLessThanOrEqual(3);
		const next = await runRealizations(recipe, [7]);
		expect(next.get(7)![0]).toBe(7);
	});

	it('stops when its signal aborts while it waits for a realization: the running batch’s workers are terminated', async () => {
		terminated = 0;
		const abort = new AbortController();
		const it = streamRealizations(recipe, [29, 28], { signal: abort.signal });
		const first = it.next();
		await wait(1);
		abort.abort();
		await expect(first).rejects.toThrow(/cancel/i);
		expect(terminated).toBeGreaterThan(0);
	});

	it('a reader that stalls does not hold the pool: another run completes while the stream waits to be read', async () => {
		const stalled = streamRealizations(recipe, Array.from({ length: 10 }, (_, r) => r), { ahead: 2 });
		expect((await stalled.next()).value![0]).toBe(0);
		// The reader now stops reading (as a paused download does) — the pool must still serve others.
		const other = await Promise.race([runRealizations(recipe, [3]), wait(2000).then(() => null)]);
		expect(other?.get(3)![0]).toBe(3);
		await stalled.return(undefined);
	});
});
