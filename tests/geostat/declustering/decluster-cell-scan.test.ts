import { describe, it, expect } from 'vitest';
import { cellDeclusterWeights, declusterCellScan, weightedMean, type Sample } from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

const s = (x: number, y: number, z: number, value = 0): Sample => ({ x, y, z, value });

describe('declusterCellScan(samples, { sizes })', () => {
	// A preferentially sampled high: ten samples of 10 clustered near (0, 0), five of 1 spread every 20 m.
	const samples: Sample[] = [
		...Array.from({ length: 10 }, (_, i) => s(i * 0.5, 0, 0, 10)),
		...Array.from({ length: 5 }, (_, i) => s(20 * (i + 1), 0, 0, 1))
	];

	it('declusterCellScan reports the naive mean for tiny cells and a lower declustered mean for cluster-sized cells', () => {
		const rows = declusterCellScan(samples, { sizes: [0.1, 10, 1000] });
		expect(rows.map((r) => r.size)).toEqual([0.1, 10, 1000]);
		// 0.1: every sample its own cell → equal weights → (100 + 5)/15 = 7.
		expectAbsClose(rows[0].mean, 7, 1e-14);
		// 10: the cluster fills one cell, each spread sample its own → (10 + 5·1)/6 = 2.5.
		expectAbsClose(rows[1].mean, 2.5, 1e-14);
		// 1000: one cell → equal weights again → 7.
		expectAbsClose(rows[2].mean, 7, 1e-14);
		expect(rows[1].cell).toEqual({ x: 10, y: 10, z: Infinity });
	});

	it('declusterCellScan means equal weightedMean with cellDeclusterWeights (1e-15 absolute)', () => {
		const cell = { x: 7, y: 3.5, z: 14 };
		const [row] = declusterCellScan(samples, { sizes: [7], yRatio: 0.5, zRatio: 2 });
		expect(row.cell).toEqual(cell);
		expectAbsClose(row.mean, weightedMean(samples.map((p) => p.value), cellDeclusterWeights(samples, cell)), 1e-15);
	});

	it('declusterCellScan rejects no sizes, a bad size and bad ratios', () => {
		expect(() => declusterCellScan(samples, { sizes: [] })).toThrow('no sizes');
		expect(() => declusterCellScan(samples, { sizes: [-1] })).toThrow('cell sizes must be > 0');
		expect(() => declusterCellScan(samples, { sizes: [1], yRatio: 0 })).toThrow('ratios must be > 0');
	});
});
