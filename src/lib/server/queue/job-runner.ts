/**
 * The export JobRunner when REDIS_URL is set: an export job's own work (reading the database, writing its ZIP into
 * the export store, its progress, its mail) stays on the web server, which is the system of record, while its
 * realizations are range jobs on the BullMQ queue, made by the queue's workers (src/lib/server/queue/realizations.ts,
 * in use through useRealizationQueue). Since the web server then only formats and writes, it runs up to
 * `concurrency` export jobs at once (default 2), so a small export is not held up behind a large one; the
 * queue's workers take their ranges in the order they were queued. Cancel and progress are the in-process runner's.
 */
import { InProcessJobRunner, type JobRunner, type JobWork } from '../exports/job-runner';
import type { QueueRealizations } from './realizations';

export class QueueJobRunner implements JobRunner {
	private readonly local: InProcessJobRunner;

	constructor(
		work: JobWork,
		readonly queue: QueueRealizations,
		{ concurrency = 2 }: { concurrency?: number } = {}
	) {
		this.local = new InProcessJobRunner(work, { concurrency });
	}

	submit(jobId: string): void {
		this.local.submit(jobId);
	}

	/** Stops a job: a running one stops reading, removes its waiting ranges and ends its run (workers drop it). */
	cancel(jobId: string): boolean {
		return this.local.cancel(jobId);
	}

	counts(): { waiting: number; active: number } {
		return this.local.counts();
	}

	/** Stops the jobs, then closes the queue's connections. */
	async close(): Promise<void> {
		await this.local.close();
		await this.queue.close();
	}
}
