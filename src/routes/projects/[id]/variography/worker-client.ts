// The page's handle on workers/variography.ts: one module worker, jobs numbered so a newer request can cancel an older one.
import * as Comlink from 'comlink';
import type { VariographyApi } from '../../../../../workers/variography';
import type { DomainSamplesData, ExperimentalResult, Progress, VariogramSettings } from '$lib/variography';

export class VariographyWorker {
	private readonly worker: Worker;
	readonly api: Comlink.Remote<VariographyApi>;
	private job = 0;
	private running: number | null = null;

	constructor() {
		this.worker = new Worker(new URL('../../../../../workers/variography.ts', import.meta.url), { type: 'module', name: 'variography' });
		this.api = Comlink.wrap<VariographyApi>(this.worker);
	}

	/** Starts the variograms of `data`; a job still running is cancelled first. Rejects with name 'CancelledError' when cancelled. */
	async variograms(data: Pick<DomainSamplesData, 'samples' | 'weights'>, settings: VariogramSettings, onProgress: (p: Progress) => void): Promise<ExperimentalResult> {
		this.cancel();
		const id = ++this.job;
		this.running = id;
		try {
			return await this.api.variograms(id, data, settings, Comlink.proxy(onProgress));
		} finally {
			if (this.running === id) this.running = null;
		}
	}

	cancel(): void {
		if (this.running !== null) void this.api.cancel(this.running);
	}

	terminate(): void {
		this.api[Comlink.releaseProxy]();
		this.worker.terminate();
	}
}
