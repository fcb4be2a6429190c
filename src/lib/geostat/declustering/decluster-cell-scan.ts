import type { Sample } from '../types';
import { cellDeclusterWeights } from './cell-decluster-weights';

/** One row of a cell-size scan. */
export interface DeclusterScanRow {
	/** Cell size along x. */
	size: number;
	cell: { x: number; y: number; z: number };
	/** Declustered (weighted) mean of the sample values with this cell. */
	mean: number;
}

/**
 * Scans cell sizes for cell declustering and reports the declustered mean at each (Deutsch 1989):
 * the user typically picks the size that minimises the mean when high values are preferentially sampled,
 * or maximises it when low values are. Cell y and z sizes are size·yRatio and size·zRatio
 * (defaults 1 and Infinity: plan cells over the full depth, the usual choice for vertical soundings).
 * @throws {TypeError} {RangeError} as cellDeclusterWeights; RangeError on no sizes, a size not > 0, a ratio not > 0
 */
export function declusterCellScan(
	samples: Sample[],
	opts: { sizes: ArrayLike<number>; yRatio?: number; zRatio?: number }
): DeclusterScanRow[] {
	const { sizes, yRatio = 1, zRatio = Infinity } = opts;
	if (sizes === null || typeof sizes !== 'object' || typeof sizes.length !== 'number') throw new TypeError('sizes must be array-like');
	if (sizes.length === 0) throw new RangeError('no sizes');
	if (!(yRatio > 0) || !(zRatio > 0)) throw new RangeError('ratios must be > 0');
	const rows: DeclusterScanRow[] = [];
	for (let k = 0; k < sizes.length; k++) {
		const size = sizes[k];
		if (!(size > 0)) throw new RangeError('cell sizes must be > 0');
		const cell = { x: size, y: size * yRatio, z: size * zRatio };
		const w = cellDeclusterWeights(samples, cell);
		let m = 0;
		for (let i = 0; i < samples.length; i++) {
			if (!Number.isFinite(samples[i].value)) throw new RangeError('values must be finite');
			m += w[i] * samples[i].value;
		}
		rows.push({ size, cell, mean: m });
	}
	return rows;
}
