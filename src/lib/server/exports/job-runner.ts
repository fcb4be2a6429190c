/**
 * Where export jobs run. The routes and services only ever talk to a JobRunner: submit a stored job by its id,
 * cancel it, close. The in-process runner here runs one job at a time in this server's process (the realizations
 * themselves run on the worker pool); a distributed queue can take its place by implementing the same three calls
 * and calling the same `work` function on its workers, without touching the routes.
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
}

/** One job at a time, in order, in this process. */
export class InProcessJobRunner implements JobRunner {
	private readonly queue: string[] = [];
	private running: { id: string; abort: AbortController; done: Promise<void> } | null = null;
	private closed = false;

	constructor(private readonly work: JobWork) {}

	submit(jobId: string): void {
		if (this.closed || this.queue.includes(jobId) || this.running?.id === jobId) return;
		this.queue.push(jobId);
		this.next();
	}

	cancel(jobId: string): boolean {
		const k = this.queue.indexOf(jobId);
		if (k >= 0) {
			this.queue.splice(k, 1);
			return true;
		}
		if (this.running?.id === jobId) {
			this.running.abort.abort();
			return true;
		}
		return false;
	}

	async close(): Promise<void> {
		this.closed = true;
		this.queue.length = 0;
		const r = this.running;
		r?.abort.abort();
		await r?.done;
	}

	private next(): void {
		if (this.running || this.closed) return;
		const id = this.queue.shift();
		if (id === undefined) return;
		const abort = new AbortController();
		const done = this.work(id, abort.signal)
			.catch((err) => console.error('[exports] job', id, err))
			.finally(() => {
				this.running = null;
				this.next();
			});
		this.running = { id, abort, done };
	}
}
