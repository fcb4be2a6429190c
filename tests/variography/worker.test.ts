// The worker's API exercised through comlink over a real MessageChannel, as the page uses it: progress
// arrives through a comlink.proxy callback and a cancel() message stops a running job between chunks.
import { afterAll, describe, expect, it } from 'vitest';
import * as Comlink from 'comlink';
import { MessageChannel } from 'node:worker_threads';
import { variographyApi, type VariographyApi } from '../../workers/variography';
import { experimentalVariogram, fitVariogram } from '../../src/lib/geostat/index';
import { prepareSamples, type Progress, type VariogramSettings } from '../../src/lib/variography/index';
import { CancelledError } from '../../src/lib/cancelled-error';
import { handDomain } from './fixture';

const channel = new MessageChannel();
Comlink.expose(variographyApi, channel.port1 as unknown as Comlink.Endpoint);
const api = Comlink.wrap<VariographyApi>(channel.port2 as unknown as Comlink.Endpoint);
afterAll(() => {
	channel.port1.close();
	channel.port2.close();
});

const settings: VariogramSettings = {
	transform: 'normal-score',
	declustered: true,
	trend: 'none',
	vertical: { lag: 0.1, nLags: 20, lagTolerance: 0.05 },
	horizontal: { lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1, azimuth: null, angleTolerance: 22.5 },
	minPairs: 30
};

describe('workers/variography through comlink', () => {
	const data = handDomain({ soundings: 12, readings: 400 });

	it('variograms(job, data, settings, progress) equals direct engine calls on the normal scores and reports progress', async () => {
		const seen: number[] = [];
		const r = await api.variograms(1, data, settings, Comlink.proxy((p: Progress) => seen.push(p.done)));
		const samples = prepareSamples(data, settings).samples;
		const v = experimentalVariogram(samples, { direction: 'vertical', lag: 0.1, nLags: 20, lagTolerance: 0.05 });
		const h = experimentalVariogram(samples, { direction: 'horizontal', lag: 7.5, nLags: 12, lagTolerance: 3.75, verticalBand: 0.1 });
		expect(r.vertical.map((b) => b.pairs)).toEqual(v.map((b) => b.pairs));
		expect(r.horizontal.map((b) => b.pairs)).toEqual(h.map((b) => b.pairs));
		// Summation order differs between chunks and one call: 1e-12 relative.
		r.vertical.forEach((b, k) => expect(Math.abs(b.gamma - v[k].gamma)).toBeLessThanOrEqual(1e-12 * v[k].gamma));
		r.horizontal.forEach((b, k) => expect(Math.abs(b.gamma - h[k].gamma)).toBeLessThanOrEqual(1e-12 * h[k].gamma));
		// 4800 samples in chunks of 4000: 2 vertical groups + 2 slabs; progress 0..4 (delivered asynchronously).
		await new Promise((r) => setTimeout(r, 20));
		expect(seen).toEqual([0, 1, 2, 3, 4]);
	});

	it('cancel(job) sent while a job runs makes it reject with a CancelledError', async () => {
		let sent = false;
		const run = api.variograms(
			2,
			data,
			settings,
			Comlink.proxy((p: Progress) => {
				if (p.done === 1 && !sent) {
					sent = true;
					void api.cancel(2);
				}
			})
		);
		const err = await run.catch((e: unknown) => e);
		// Across comlink the class is lost and the name kept; CancelledError.revive restores the class.
		expect(err).toMatchObject({ name: 'CancelledError', message: 'cancelled' });
		expect(err).not.toBeInstanceOf(CancelledError);
		expect(CancelledError.revive(err)).toBeInstanceOf(CancelledError);
		// The job's mark is cleared, so the same id can run again.
		await expect(api.variograms(2, data, settings)).resolves.toHaveProperty('n', 4800);
	});

	it('fit(bins) and evaluate(parameters, bins) answer with fitVariogram\'s model (sill held at the variance) and the misfit', async () => {
		const r = await api.variograms(3, data, settings);
		const bins = { vertical: r.vertical, horizontal: r.horizontal, horizontalMinor: r.horizontalMinor };
		const fit = await api.fit(bins, { type: 'spherical', nugget: 'fit', minPairs: 30, azimuth: 0, variance: r.variance });
		const direct = fitVariogram({ vertical: r.vertical, horizontal: r.horizontal }, { type: 'spherical', nugget: 'fit', sill: r.variance, minPairs: 30 });
		expect(fit.parameters.rangeVertical).toBe(direct.structures[1].rangeVertical);
		expect(fit.parameters.rangeMajor).toBe(direct.structures[1].rangeMajor);
		expect(fit.parameters.sill).toBe(r.variance);
		const ev = await api.evaluate(fit.parameters, bins, 30);
		expect(ev.misfit.total!.wss).toBe(fit.misfit.total!.wss);
		expect(ev.sensitivity.horizontal!.range).toBe(fit.parameters.rangeMajor);
		expect(ev.sensitivity.vertical!.range).toBe(fit.parameters.rangeVertical);
		expect(ev.sensitivity.minor).toBeNull();
	});

	it('variograms rejects an invalid setting with the engine\'s message', async () => {
		await expect(api.variograms(4, data, { ...settings, horizontal: { ...settings.horizontal, angleTolerance: 120, azimuth: 10 } })).rejects.toThrow(
			'angleTolerance must be in (0, 90]'
		);
	});
});
