import { CancelledError } from '../cancelled-error';
import { experimentalVariogram, experimentalVariogramMap, type LagBin, type Sample, type VariogramMap } from '../geostat';
import type { ExperimentalResult, Progress, VariogramSettings } from './types';
import type { PreparedSamples } from './prepare-samples';
import { plateauCheck } from './plateau-check';

export interface ComputeOptions {
	/** Called after each chunk (and once at the start with done 0). */
	onProgress?: (p: Progress) => void;
	/** Checked before each chunk; when it returns true the computation stops with a CancelledError. */
	isCancelled?: () => boolean;
	/** Samples per chunk (default 4000): the work between two progress reports and cancellation checks. */
	chunkSize?: number;
	/**
	 * Awaited between chunks so messages (a cancel request) can arrive; default a zero-delay timeout.
	 */
	pause?: () => Promise<void>;
	/** Also compute the variogram map in plan (3D domains), with the horizontal lag, lags and band. */
	map?: boolean;
}

/**
 * The vertical and horizontal experimental variograms of prepared samples, computed with
 * experimentalVariogram (Matheron's estimator) in chunks so a worker can report progress and be cancelled.
 *
 * Chunks give the same bins as one engine call, up to floating-point summation order:
 * - vertical pairs lie within one sounding, so the soundings are split into groups and the groups' bin sums
 *   (pair count, Σh, Σ(Δv)²) are added;
 * - horizontal pairs have |dz| ≤ verticalBand, so the samples sorted by z are cut into slabs Sᵢ; with Eᵢ the
 *   later samples within the band above Sᵢ, every pair is counted exactly once by
 *   Σᵢ [pairs(Sᵢ ∪ Eᵢ) − pairs(Eᵢ)] (inclusion–exclusion; the subtraction is exact for the counts).
 * The horizontal variogram is omnidirectional, or along `azimuth` ± `angleTolerance` when an azimuth is set,
 * with a second one across it (azimuth + 90°). The map (experimentalVariogramMap) is chunked the same way.
 * The result also compares each direction's plateau with the variance (plateauCheck).
 * @throws {CancelledError} when isCancelled() turns true; the engine's errors on invalid settings
 */
export async function computeVariograms(
	prepared: PreparedSamples,
	settings: VariogramSettings,
	{ onProgress, isCancelled = () => false, chunkSize = 4000, pause = defaultPause, map = false }: ComputeOptions = {}
): Promise<ExperimentalResult> {
	const { samples } = prepared;
	const v = settings.vertical;
	const h = settings.horizontal;
	const vOpts = { direction: 'vertical' as const, lag: v.lag, nLags: v.nLags, lagTolerance: v.lagTolerance };
	const hOpts = {
		direction: 'horizontal' as const,
		lag: h.lag,
		nLags: h.nLags,
		lagTolerance: h.lagTolerance,
		verticalBand: h.verticalBand,
		...(h.azimuth === null ? {} : { azimuth: h.azimuth, angleTolerance: h.angleTolerance })
	};
	const mOpts = h.azimuth === null ? null : { ...hOpts, azimuth: h.azimuth + 90 };
	const mapOpts = { lag: h.lag, nLags: h.nLags, verticalBand: h.verticalBand };
	// Validate every option set up front so a bad setting fails before any chunk runs.
	experimentalVariogram([], vOpts);
	experimentalVariogram([], hOpts);
	if (map) experimentalVariogramMap([], mapOpts);

	const vChunks = soundingGroups(samples, chunkSize);
	const hChunks = zSlabs(samples, chunkSize, h.verticalBand);
	const total = vChunks.length + hChunks.length;
	let done = 0;
	onProgress?.({ done, total, stage: 'vertical' });
	const step = async (stage: string) => {
		done++;
		onProgress?.({ done, total, stage });
		await pause();
	};

	const vSum = new BinSums(v.nLags);
	for (const group of vChunks) {
		if (isCancelled()) throw new CancelledError();
		vSum.add(experimentalVariogram(group, vOpts), 1);
		await step('vertical');
	}
	const hSum = new BinSums(h.nLags);
	const mSum = mOpts ? new BinSums(h.nLags) : null;
	const mapSum = map ? new MapSums(h.nLags) : null;
	for (const { union, extension } of hChunks) {
		if (isCancelled()) throw new CancelledError();
		const both = extension.length > 1;
		hSum.add(experimentalVariogram(union, hOpts), 1);
		if (both) hSum.add(experimentalVariogram(extension, hOpts), -1);
		if (mSum && mOpts) {
			mSum.add(experimentalVariogram(union, mOpts), 1);
			if (both) mSum.add(experimentalVariogram(extension, mOpts), -1);
		}
		if (mapSum) {
			mapSum.add(experimentalVariogramMap(union, mapOpts), 1);
			if (both) mapSum.add(experimentalVariogramMap(extension, mapOpts), -1);
		}
		await step('horizontal');
	}
	const bins = { vertical: vSum.bins(v.lag), horizontal: hSum.bins(h.lag), horizontalMinor: mSum ? mSum.bins(h.lag) : null };
	return {
		...bins,
		map: mapSum ? mapSum.map(h.lag) : null,
		variance: prepared.variance,
		mean: prepared.mean,
		n: samples.length,
		soundings: prepared.soundings,
		trend: prepared.trend,
		plateau: plateauCheck(bins, prepared.variance, settings.minPairs)
	};
}

function defaultPause(): Promise<void> {
	return new Promise((resolve) => setTimeout(resolve, 0));
}

class BinSums {
	readonly count: Float64Array;
	readonly sumH: Float64Array;
	readonly sumSq: Float64Array;
	constructor(n: number) {
		this.count = new Float64Array(n);
		this.sumH = new Float64Array(n);
		this.sumSq = new Float64Array(n);
	}
	add(bins: LagBin[], sign: 1 | -1): void {
		bins.forEach((b, k) => {
			if (b.pairs === 0) return;
			this.count[k] += sign * b.pairs;
			this.sumH[k] += sign * b.h * b.pairs;
			this.sumSq[k] += sign * 2 * b.gamma * b.pairs;
		});
	}
	bins(lag: number): LagBin[] {
		return Array.from(this.count, (n, k) =>
			n > 0 ? { h: this.sumH[k] / n, gamma: this.sumSq[k] / (2 * n), pairs: n } : { h: (k + 1) * lag, gamma: NaN, pairs: 0 }
		);
	}
}

class MapSums {
	readonly size: number;
	readonly count: Float64Array;
	readonly sumDx: Float64Array;
	readonly sumDy: Float64Array;
	readonly sumSq: Float64Array;
	constructor(readonly nLags: number) {
		this.size = 2 * nLags + 1;
		const cells = this.size * this.size;
		this.count = new Float64Array(cells);
		this.sumDx = new Float64Array(cells);
		this.sumDy = new Float64Array(cells);
		this.sumSq = new Float64Array(cells);
	}
	add(m: VariogramMap, sign: 1 | -1): void {
		for (let c = 0; c < m.pairs.length; c++) {
			const n = m.pairs[c];
			if (n === 0) continue;
			this.count[c] += sign * n;
			this.sumDx[c] += sign * m.dx[c] * n;
			this.sumDy[c] += sign * m.dy[c] * n;
			this.sumSq[c] += sign * 2 * m.gamma[c] * n;
		}
	}
	map(lag: number): VariogramMap {
		const { size, nLags } = this;
		const cells = size * size;
		const out: VariogramMap = { lag, nLags, size, dx: new Float64Array(cells), dy: new Float64Array(cells), gamma: new Float64Array(cells), pairs: new Float64Array(cells) };
		for (let c = 0; c < cells; c++) {
			const n = this.count[c];
			out.pairs[c] = n;
			if (n > 0) {
				out.dx[c] = this.sumDx[c] / n;
				out.dy[c] = this.sumDy[c] / n;
				out.gamma[c] = this.sumSq[c] / (2 * n);
			} else {
				out.dx[c] = ((c % size) - nLags) * lag;
				out.dy[c] = (Math.floor(c / size) - nLags) * lag;
				out.gamma[c] = NaN;
			}
		}
		return out;
	}
}

/** Soundings grouped (in first-seen order) into chunks of about `size` samples; samples without a sounding have no vertical pairs. */
function soundingGroups(samples: Sample[], size: number): Sample[][] {
	const by = new Map<string, Sample[]>();
	for (const s of samples) {
		if (s.sounding === undefined) continue;
		const g = by.get(s.sounding);
		if (g) g.push(s);
		else by.set(s.sounding, [s]);
	}
	const chunks: Sample[][] = [];
	let cur: Sample[] = [];
	for (const g of by.values()) {
		if (cur.length > 0 && cur.length + g.length > size) {
			chunks.push(cur);
			cur = [];
		}
		cur = cur.concat(g);
	}
	if (cur.length > 0) chunks.push(cur);
	return chunks;
}

/** Slabs of about `size` samples in z order, each with the later samples within `band` above its top. */
function zSlabs(samples: Sample[], size: number, band: number): { union: Sample[]; extension: Sample[] }[] {
	const order = samples.map((_, i) => i).sort((a, b) => samples[a].z - samples[b].z || a - b);
	const out: { union: Sample[]; extension: Sample[] }[] = [];
	for (let start = 0; start < order.length; start += size) {
		const end = Math.min(order.length, start + size);
		const top = samples[order[end - 1]].z;
		let stop = end;
		while (stop < order.length && samples[order[stop]].z - top <= band) stop++;
		const pick = (a: number, b: number) => order.slice(a, b).map((i) => samples[i]);
		out.push({ union: pick(start, stop), extension: pick(end, stop) });
	}
	return out;
}
