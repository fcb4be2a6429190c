import seedrandom from 'seedrandom';
import type { Sample } from '../src/lib/geostat/index';
import { autoFit, computeVariograms, mapAnisotropy, type PreparedSamples, type VariogramSettings } from '../src/lib/variography/index';
import type { BenchCase } from './index';

/** 144 soundings on a 12 × 12 plan grid 15 m apart, 60 readings each at 0.1 m, values correlated within soundings. */
function prepared(): PreparedSamples {
	const rng = seedrandom('bench-variogram-fit');
	const samples: Sample[] = [];
	for (let s = 0; s < 144; s++) {
		const x = (s % 12) * 15 + 4 * rng();
		const y = Math.floor(s / 12) * 15 + 4 * rng();
		let v = 0;
		for (let i = 0; i < 60; i++) {
			v = 0.8 * v + rng() - 0.5 + 0.01 * Math.sin((x + 2 * y) / 40);
			samples.push({ x, y, z: -0.1 * i, value: v, sounding: `S${s}` });
		}
	}
	return { samples, variance: 1, mean: 0, soundings: 144, trend: null };
}

const settings: VariogramSettings = {
	transform: 'none',
	declustered: false,
	trend: 'none',
	vertical: { lag: 0.1, nLags: 30, lagTolerance: 0.05 },
	horizontal: { lag: 10, nLags: 12, lagTolerance: 5, verticalBand: 0.05, azimuth: 30, angleTolerance: 22.5 },
	minPairs: 30
};

/** Median of three timed runs after a warm-up, in ms. */
async function median(run: () => unknown): Promise<number> {
	await run();
	const times: number[] = [];
	for (let r = 0; r < 3; r++) {
		const t0 = performance.now();
		await run();
		times.push(performance.now() - t0);
	}
	times.sort((a, b) => a - b);
	return Math.round(times[1] * 10) / 10;
}

const fit3: BenchCase = {
	name: 'variogram-fit-3d',
	async run() {
		const p = prepared();
		const r = await computeVariograms(p, settings, { pause: async () => {}, map: true });
		const options = { type: 'exponential' as const, nugget: 'fit' as const, minPairs: 30, azimuth: 30, variance: p.variance };
		const ms = await median(() => autoFit(r, options));
		const cells = r.map!.pairs.filter((n) => n >= 30).length;
		const mapMs = await median(() => mapAnisotropy(r.map!, { type: 'exponential', nugget: 0, sill: 1 }, 30));
		const twoMs = await median(() => autoFit({ vertical: r.vertical, horizontal: r.horizontal }, { ...options, azimuth: 0 }));
		return { ms, twoDirectionsMs: twoMs, mapAnisotropyMs: mapMs, mapCells: cells };
	}
};

export default [fit3];
