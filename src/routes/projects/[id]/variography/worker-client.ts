// The page's handle on workers/variography.ts: one module worker, jobs numbered so a newer request can cancel an older one.
import * as Comlink from 'comlink';
import type { VariographyApi } from '../../../../../workers/variography';
import { CancelledError } from '$lib/cancelled-error';
import type { VariogramMap } from '$lib/geostat';
import type { AutoFitBins, AutoFitOptions, DomainSamplesData, ModelParameters, Progress, VariogramSettings } from '$lib/variography';
import type { EvaluationBins, VariographyEngine } from './engine';

export class VariographyWorker implements VariographyEngine {
	private readonly worker: Worker;
	private readonly api: Comlink.Remote<VariographyApi>;
	private job = 0;
	private running: number | null = null;

	constructor() {
		this.worker = new Worker(new URL('../../../../../workers/variography.ts', import.meta.url), { type: 'module', name: 'variography' });
		this.api = Comlink.wrap<VariographyApi>(this.worker);
	}

	async variograms(data: Pick<DomainSamplesData, 'samples' | 'weights' | 'geometry'>, settings: VariogramSettings, onProgress: (p: Progress) => void) {
		this.cancel();
		const id = ++this.job;
		this.running = id;
		try {
			return await this.api.variograms(id, data, settings, Comlink.proxy(onProgress));
		} catch (err) {
			throw CancelledError.revive(err);
		} finally {
			if (this.running === id) this.running = null;
		}
	}

	cancel(): void {
		if (this.running !== null) void this.api.cancel(this.running);
	}

	fit(bins: AutoFitBins, opts: AutoFitOptions) {
		return this.api.fit(bins, opts);
	}

	evaluate(parameters: ModelParameters, bins: EvaluationBins, minPairs: number) {
		return this.api.evaluate(parameters, bins, minPairs);
	}

	anisotropy(map: VariogramMap, parameters: Pick<ModelParameters, 'type' | 'nugget' | 'sill'>, minPairs: number) {
		return this.api.anisotropy(map, parameters, minPairs);
	}

	terminate(): void {
		this.api[Comlink.releaseProxy]();
		this.worker.terminate();
	}
}
