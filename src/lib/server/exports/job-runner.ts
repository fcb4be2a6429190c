/**
 * Where export jobs run. The routes and services only ever talk to a JobRunner: submit a stored job by its id,
 * cancel it, close. The in-process runner here runs one job at a time in this server's process (the realizations
 * themselves run on the worker pool); with REDIS_URL set, the queue's runner (src/lib/server/queue/job-runner.ts)
 * takes its place: the same `work` on the web server, its realizations made by the queue's workers.
 */

/** The work of one job: runs it to the end, or stops soon after `signal` aborts. Reports through the job's row. */
export type JobWork = (jobId: string, signal: AbortSignal) => Promise<void>;

export interface JobRunner {
	/** Queues a stored job; it runs after the jobs queued before it. */
	submit(jobId: string): void;
	/** Stops a queued or running job; false when the runner does not know it (finished, or never submitted). */
	cancel(jobId: string): boolean;
	/** Stops every job and takes no more (shutdown). */
	close(): Promise<void>;
	/** Jobs waiting and running now (the health endpoint). */
	counts(): { waiting: number; active: number };
}

/** Jobs in order, at most `concurrency` at once (default one), in this process. */
export class InProcessJobRunner implements JobRunner {
	private readonly queue: string[] = [];
	private readonly running = new Map<string, { abort: AbortController; done: Promise<void> }>();
	private closed = false;
	private readonly concurrency: number;

	constructor(
		private readonly work: JobWork,
		{ concurrency = 1 }: { concurrency?: number } = {}
	) {
		this.concurrency = Math.max(1, Math.floor(concurrency));
	}

	submit(jobId: string): void {
		if (this.closed || this.queue.includes(jobId) || this.running.has(jobId)) return;
		this.queue.push(jobId);
		this.next();
	}

	cancel(jobId: string): boolean {
		const k = this.queue.indexOf(jobId);
		if (k >= 0) {
			this.queue.splice(k, 1);
			return true;
		}
		const job = this.running.get(jobId);
		if (job) {
			job.abort.abort();
			return true;
		}
		return false;
	}

	counts(): { waiting: number; active: number } {
		return { waiting: this.queue.length, active: this.running.size };
	}

	async close(): Promise<void> {
		this.closed = true;
		this.queue.length = 0;
		const jobs = [...this.running.values()];
		for (const j of jobs) j.abort.abort();
		await Promise.all(jobs.map((j) => j.done));
	}

	private next(): void {
		while (!this.closed && this.running.size < this.concurrency) {
			const id = this.queue.shift();
			if (id === undefined) return;
			const abort = new AbortController();
			const done = this.work(id, abort.signal)
				.catch((err) => console.error('[exports] job', id, err))
				.finally(() => {
					this.running.delete(id);
					this.next();
				});
			this.running.set(id, { abort, done });
		}
	}
}
