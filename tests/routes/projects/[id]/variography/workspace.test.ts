// The variography page's state class, driven as the page drives it, against an in-memory API and the workspace's
// computations run in this thread (workers/variography.ts without the worker), so every figure is the engine's.
import { describe, expect, it } from 'vitest';
import type { DomainSamples, ProjectApi, VariogramView, ZonationView } from '../../../../../src/lib/api/index';
import {
	autoFit,
	computeVariograms,
	defaultSettings,
	modelFromParameters,
	modelMisfit,
	prepareSamples,
	type SavedVariogramSettings
} from '../../../../../src/lib/variography/index';
import type { VariographyEngine } from '../../../../../src/routes/projects/[id]/variography/engine';
import { VariographyWorkspace } from '../../../../../src/routes/projects/[id]/variography/workspace.svelte';
import { analysedSpace } from '../../../../../src/routes/projects/[id]/variography/analysed-space';
import { variographyApi } from '../../../../../workers/variography';
import { handDomain } from '../../../../variography/fixture';
import { DEFAULT_RULES, emptyRuleCounts } from '../../../../../src/lib/site/index';

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));
async function until(check: () => boolean, what: string, ms = 10_000) {
	const end = Date.now() + ms;
	while (!check()) {
		if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
		await wait(5);
	}
}

function samplesOf(id: string, name: string, seed: string): DomainSamples {
	const d = handDomain({ soundings: 6, readings: 120, seed });
	return {
		...d,
		domain: { id, name, zonationId: 'z1', zonationName: 'By unit', property: 'qc1Ncs', cellHeight: null, averaging: 'none', declusterCell: { x: 40, y: 40, z: null }, rules: DEFAULT_RULES },
		property: { key: 'qc1Ncs', label: 'qc1Ncs', unit: '–' },
		geometry: '2d',
		stats: { n: d.samples.value.length, mean: 0, sd: 0, p10: 0, p50: 0, p90: 0 },
		soundings: [],
		cdf: { value: [], p: [] },
		warnings: [],
		leftOut: [],
		counts: { ...emptyRuleCounts(), readings: d.samples.value.length, kept: d.samples.value.length }
	};
}

/** An in-memory project: two domains, saved versions and comments, recording what was sent. */
function memoryApi(saved: VariogramView[] = []) {
	const zonations = [
		{ id: 'z1', name: 'By unit', description: '', domains: [{ id: 'sand', name: 'Sand' }, { id: 'clay', name: 'Clay' }] }
	] as unknown as ZonationView[];
	const samples: Record<string, DomainSamples> = { sand: samplesOf('sand', 'Sand', 'a'), clay: samplesOf('clay', 'Clay', 'b') };
	const versions = [...saved];
	const sent: unknown[] = [];
	const api = {
		zonations: async () => zonations,
		domainSamples: async (id: string) => samples[id],
		variograms: async (id: string) => versions.filter((v) => v.domainId === id),
		saveVariogram: async (domainId: string, input: { name: string; model: VariogramView['model']; settings: SavedVariogramSettings; misfit: number | null; note?: string }) => {
			sent.push(input);
			const v: VariogramView = {
				id: `v${versions.length + 1}`,
				domainId,
				name: input.name,
				version: versions.filter((x) => x.name === input.name).length + 1,
				model: input.model,
				settings: input.settings,
				misfit: input.misfit,
				note: input.note ?? '',
				createdBy: null,
				createdAt: new Date(0).toISOString(),
				comments: 0
			};
			versions.unshift(v);
			return v;
		},
		restoreVariogram: async (domainId: string, id: string) => {
			const old = versions.find((v) => v.id === id)!;
			return api.saveVariogram(domainId, { ...old, note: `Restored from version ${old.version}.` });
		}
	};
	return { api: api as unknown as ProjectApi, samples, versions, sent };
}

/** The worker's API called in this thread, with the worker client's job bookkeeping. */
function inProcess(): VariographyEngine & { jobs: number } {
	let running: number | null = null;
	const engine = {
		jobs: 0,
		async variograms(...[data, settings, onProgress]: Parameters<VariographyEngine['variograms']>) {
			engine.cancel();
			const id = ++engine.jobs;
			running = id;
			try {
				return await variographyApi.variograms(id, data, settings, onProgress);
			} finally {
				if (running === id) running = null;
			}
		},
		cancel() {
			if (running !== null) variographyApi.cancel(running);
		},
		fit: async (...a: Parameters<VariographyEngine['fit']>) => variographyApi.fit(...a),
		evaluate: async (...a: Parameters<VariographyEngine['evaluate']>) => variographyApi.evaluate(...a),
		anisotropy: async (...a: Parameters<VariographyEngine['anisotropy']>) => variographyApi.anisotropy(...a),
		terminate() {}
	};
	return engine;
}

async function opened(saved: VariogramView[] = [], wanted: string | null = 'sand') {
	const project = memoryApi(saved);
	const engine = inProcess();
	const shown: string[] = [];
	const ws = new VariographyWorkspace(project.api, () => engine, (id) => shown.push(id));
	await ws.start(wanted);
	await until(() => ws.result !== null && !ws.running, 'the first result');
	return { ws, engine, shown, ...project };
}

describe('VariographyWorkspace', () => {
	it('start(domain) opens that domain with default settings, computes, and reports the domain for the URL', async () => {
		const { ws, shown, samples } = await opened([], 'clay');
		expect(shown).toEqual(['clay']);
		expect([ws.zonationId, ws.domainId, ws.resultFor]).toEqual(['z1', 'clay', 'clay']);
		expect(ws.settings).toEqual(defaultSettings(samples.clay));
		const node = await computeVariograms(prepareSamples(samples.clay, ws.settings!), ws.settings!);
		expect(ws.result).toEqual(node);
		expect(JSON.parse(ws.resultSettings)).toEqual(ws.settings);
		expect(ws.valueLabel).toBe('γ(h) of normal scores of qc1Ncs (–)');
		expect(ws.fileBase).toBe('by-unit-clay');
		ws.destroy();
	});

	it('start(unknown) opens the first domain; selectDomain drops an answer that arrives for a domain no longer shown', async () => {
		const { ws } = await opened([], 'nope');
		expect(ws.domainId).toBe('sand');
		ws.settings!.vertical.nLags += 1;
		const slow = ws.compute();
		await ws.selectDomain('clay');
		await slow;
		await until(() => ws.resultFor === 'clay' && !ws.running, 'the clay result');
		expect(ws.result!.n).toBe(ws.data!.samples.value.length);
		expect(ws.notices.problem).toBe('');
		ws.destroy();
	});

	it('a saved version is loaded on opening: settings, fit request and parameters; the status says which', async () => {
		const settings: SavedVariogramSettings = {
			...defaultSettings(samplesOf('sand', 'Sand', 'a')),
			transform: 'none',
			fit: { type: 'spherical', nugget: 0.5 }
		};
		const params = { type: 'spherical' as const, nugget: 0.5, sill: 60, rangeVertical: 0.6, rangeMajor: 30, rangeMinor: 30, azimuth: 0 };
		const saved: VariogramView = {
			id: 'v0', domainId: 'sand', name: 'Sand raw', version: 2, model: modelFromParameters(params), settings, misfit: null,
			note: '', createdBy: null, createdAt: new Date(0).toISOString(), comments: 0
		};
		const { ws } = await opened([saved]);
		expect(ws.settings!.transform).toBe('none');
		expect(ws.model.params).toEqual(params);
		expect([ws.model.nuggetMode, ws.model.nuggetFixed, ws.model.type]).toEqual(['fixed', 0.5, 'spherical']);
		expect(ws.history.saveName).toBe('Sand raw');
		expect(ws.valueLabel).toBe('γ(h) of qc1Ncs (–)');
		await until(() => ws.model.evaluation !== null, 'the evaluation');
		expect(ws.model.evaluation!.misfit).toEqual(modelMisfit(ws.model.model!, ws.result!, ws.minPairs));
		ws.destroy();
	});

	it('settingsEdited() recomputes once after a pause, and not at all when nothing changed', async () => {
		const { ws, engine } = await opened();
		const before = engine.jobs;
		ws.settingsEdited();
		await wait(400);
		expect(engine.jobs).toBe(before);
		ws.settings!.horizontal.lag *= 2;
		ws.settingsEdited();
		ws.settingsEdited();
		expect(engine.jobs).toBe(before);
		await until(() => engine.jobs === before + 1 && !ws.running, 'the recompute');
		expect(JSON.parse(ws.resultSettings).horizontal.lag).toBe(ws.settings!.horizontal.lag);
		ws.destroy();
	});

	it('autoFit() gives autoFit\'s parameters on the shown bins, and the misfit follows', async () => {
		const { ws } = await opened();
		await ws.autoFit();
		const direct = autoFit(ws.result!, { type: 'exponential', nugget: 'fit', minPairs: ws.minPairs, azimuth: 0, variance: ws.result!.variance });
		expect(ws.model.params).toEqual(direct.parameters);
		expect(ws.notices.status).toMatch(/^Automatic fit done/);
		await until(() => ws.model.evaluation !== null, 'the evaluation');
		expect(ws.model.evaluation!.misfit).toEqual(direct.misfit);
		ws.destroy();
	});

	it('model edits: a typed value must be finite; a dragged sill stays above the nugget; a sill below the nugget makes no model', async () => {
		const { ws } = await opened();
		ws.startManual();
		const p = ws.model.params!;
		expect(p).toMatchObject({ nugget: 0, sill: ws.result!.variance, azimuth: 0 });
		expect(p.rangeVertical).toBeCloseTo((ws.settings!.vertical.lag * ws.settings!.vertical.nLags) / 3, 12);
		ws.model.setValue('nugget', NaN);
		expect(ws.model.params!.nugget).toBe(0);
		ws.model.setValue('nugget', 0.2);
		ws.model.drag('vertical', { sill: 0.1 });
		expect(ws.model.params!.sill).toBe(0.2);
		ws.model.setValue('sill', 0.1);
		expect(ws.model.model).toBeNull();
		ws.model.setType('gaussian');
		expect(ws.model.params!.type).toBe('gaussian');
		ws.destroy();
	});

	it('save() sends the model, the settings with the fit request and the data\'s context, and lists the new version', async () => {
		const { ws, sent } = await opened();
		await ws.autoFit();
		await until(() => ws.model.evaluation !== null, 'the evaluation');
		ws.history.saveName = 'Sand, first try';
		await ws.save();
		expect(sent).toHaveLength(1);
		expect(sent[0]).toMatchObject({
			name: 'Sand, first try',
			model: ws.model.model,
			settings: { ...ws.settings, fit: { type: 'exponential', nugget: 'fit' }, property: 'qc1Ncs', samples: ws.data!.samples.value.length },
			misfit: ws.model.evaluation!.misfit.total!.perBin
		});
		expect(ws.notices.status).toBe('Saved as Sand, first try v1.');
		expect(ws.history.versions.map((v) => v.name)).toEqual(['Sand, first try']);
		ws.destroy();
	});

	it('cancel() stops the running computation with a status, and lagCsv(direction) writes the shown bins', async () => {
		const { ws } = await opened();
		ws.settings!.vertical.lag /= 2;
		const run = ws.compute();
		ws.cancel();
		await run;
		expect(ws.running).toBe(false);
		expect(ws.notices.status).toBe('Cancelled. Change a setting or press Compute to run again.');
		const csv = ws.lagCsv('vertical')!.trim().split('\n');
		expect(csv.length).toBe(ws.result!.vertical.length + 1);
		ws.destroy();
	});

	it('a setting the engine refuses is a problem, not a cancellation; the last result stays', async () => {
		const { ws } = await opened();
		const shown = ws.result;
		ws.settings!.vertical.lag = -1;
		await ws.compute();
		expect(ws.notices.problem).toMatch(/lag/);
		expect(ws.notices.status).toBe('');
		expect(ws.result).toBe(shown);
		ws.destroy();
	});

	it('history.restore(v) saves an old version again as the newest, loads it and says so', async () => {
		const { ws } = await opened();
		await ws.autoFit();
		ws.history.saveName = 'Sand';
		await ws.save();
		ws.model.setValue('rangeMajor', 99);
		await ws.save();
		const v1 = ws.history.versions.find((v) => v.version === 1)!;
		await ws.history.restore(v1);
		expect(ws.history.versions.map((v) => v.version)).toEqual([3, 2, 1]);
		expect(ws.model.params!.rangeMajor).toBe(v1.model.structures[1].rangeMajor);
		expect(ws.notices.status).toBe('Restored v1 as Sand v3.');
		ws.destroy();
	});

	it('a new analysed space (transform, weights, trend) drops the old model and fits again; nothing is drawn or saved across spaces', async () => {
		const { ws, sent } = await opened();
		await ws.autoFit();
		const normal = ws.model.params!;
		expect(normal.sill).toBe(ws.result!.variance);
		expect(ws.modelMatches).toBe(true);
		// The transform changes: the result of raw values arrives, the normal-score model is dropped and refitted.
		ws.settings!.transform = 'none';
		await ws.compute();
		await until(() => !ws.model.fitting && ws.modelMatches, 'the refit');
		expect(ws.result!.variance).toBeGreaterThan(10);
		expect(ws.model.params!.sill).toBe(ws.result!.variance);
		expect(ws.model.space).toBe(analysedSpace('sand', { transform: 'none', declustered: true, trend: 'none' }));
		expect(ws.notices.status).toBe(
			'The analysed values changed (normal scores, declustered, no trend → raw values, declustered, no trend): the old model was dropped and the automatic fit run on the new bins.'
		);
		// The trend changes likewise.
		ws.settings!.trend = 'elevation';
		await ws.compute();
		await until(() => !ws.model.fitting && ws.modelMatches, 'the refit with a trend');
		expect(ws.result!.trend).not.toBeNull();
		expect(ws.notices.status).toMatch(/→ raw values, declustered, trend with elevation removed\)/);
		// A model of another space is neither drawn nor saved.
		ws.model.set(normal, analysedSpace('sand', { transform: 'normal-score', declustered: true, trend: 'none' }));
		expect(ws.modelMatches).toBe(false);
		expect(ws.curves).toBeNull();
		await ws.save();
		expect(sent).toHaveLength(0);
		ws.destroy();
	});

	it('save() sends the settings of the bins shown, not settings edited since', async () => {
		const { ws, sent } = await opened();
		await ws.autoFit();
		const shown = JSON.parse(ws.resultSettings);
		ws.settings!.horizontal.lag *= 3;
		ws.history.saveName = 'Sand';
		await ws.save();
		expect((sent[0] as { settings: unknown }).settings).toMatchObject(shown);
		ws.destroy();
	});

	it('a saved version fitted to another number of samples says the domain\'s data changed since', async () => {
		const first = await opened();
		await first.ws.autoFit();
		first.ws.history.saveName = 'Sand';
		await first.ws.save();
		const v = { ...first.versions[0], settings: { ...first.versions[0].settings, samples: 5 } };
		first.ws.destroy();
		const { ws } = await opened([v]);
		expect(ws.dataChanged).toBe(`Sand v1 was fitted to 5 samples; the domain now has ${ws.data!.samples.value.length} (its rules, contacts or soundings changed). Fit again before relying on it.`);
		await ws.autoFit();
		expect(ws.dataChanged).toBe('');
		ws.destroy();
	});
});