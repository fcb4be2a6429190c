// The export job runners: in order, at most `concurrency` at once, cancel of a queued and of a running job, counts,
// close; the queue's runner schedules the same way and closes its queue after its jobs.
import { describe, expect, it } from 'vitest';
import { InProcessJobRunner } from '../../../src/lib/server/exports/job-runner';
import { QueueJobRunner } from '../../../src/lib/server/queue/job-runner';
import type { QueueRealizations } from '../../../src/lib/server/queue/realizations';

/** A work function whose jobs finish when the test says (or stop when aborted), recording what happened. */
function controlledWork() {
	const events: string[] = [];
	const finish = new Map<string, () => void>();
	const work = (id: string, signal: AbortSignal) =>
		new Promise<void>((resolve) => {
			let over = false;
			events.push(`start ${id}`);
			finish.set(id, () => {
				over = true;
				events.push(`done ${id}`);
				resolve();
			});
			signal.addEventListener('abort', () => {
				if (over) return;
				over = true;
				events.push(`stopped ${id}`);
				resolve();
			});
		});
	return { events, finish, work };
}
const tick = () => new Promise((r) => setTimeout(r, 0));

describe('InProcessJobRunner', () => {
	it('runs one job at a time in the order submitted, ignoring a duplicate submit', async () => {
		const { events, finish, work } = controlledWork();
		const runner = new InProcessJobRunner(work);
		runner.submit('a');
		runner.submit('b');
		runner.submit('a');
		expect(runner.counts()).toEqual({ waiting: 1, active: 1 });
		finish.get('a')!();
		await tick();
		expect(events).toEqual(['start a', 'done a', 'start b']);
		finish.get('b')!();
		await tick();
		expect(runner.counts()).toEqual({ waiting: 0, active: 0 });
	});

	it('with concurrency 2 runs two at once; cancel removes a queued job and aborts a running one; close stops the rest', async () => {
		const { events, finish, work } = controlledWork();
		const runner = new InProcessJobRunner(work, { concurrency: 2 });
		for (const id of ['a', 'b', 'c', 'd']) runner.submit(id);
		expect(events).toEqual(['start a', 'start b']);
		expect(runner.cancel('c')).toBe(true);
		expect(runner.cancel('b')).toBe(true);
		await tick();
		expect(events).toEqual(['start a', 'start b', 'stopped b', 'start d']);
		expect(runner.cancel('nope')).toBe(false);
		finish.get('a')!();
		await runner.close();
		expect(events.slice(-2).sort()).toEqual(['done a', 'stopped d']);
		runner.submit('e');
		expect(runner.counts()).toEqual({ waiting: 0, active: 0 });
	});
});

describe('QueueJobRunner', () => {
	it('schedules as the in-process runner (two at once by default) and closes the queue after its jobs', async () => {
		const { events, work } = controlledWork();
		let queueClosed = false;
		const queue = { close: async () => void (queueClosed = events.includes('stopped a')) } as unknown as QueueRealizations;
		const runner = new QueueJobRunner(work, queue);
		for (const id of ['a', 'b', 'c']) runner.submit(id);
		expect(runner.counts()).toEqual({ waiting: 1, active: 2 });
		expect(runner.cancel('c')).toBe(true);
		await runner.close();
		expect(queueClosed).toBe(true);
	});
});
