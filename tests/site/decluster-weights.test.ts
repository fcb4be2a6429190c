import { describe, expect, it } from 'vitest';
import { declusterWeights, domainStatistics } from '../../src/lib/site/index';
import { expectAbsClose, expectAllAbsClose } from '../asserts';

describe('declusterWeights(samples, cell)', () => {
	// Soundings at chainages 0 and 5 share a 20 m cell; the one at 100 is alone. Two samples each.
	const samples = [0, 0, 5, 5, 100, 100].map((x, i) => ({ x, y: 0, z: -i, value: [1, 1, 3, 3, 10, 10][i], sounding: `S${x}` }));

	it('declusterWeights(samples, cell) follows Deutsch (1989) cell weights and sums to 1', () => {
		// Two occupied cells; the first holds 4 samples → 1/(4·2) each, the second 2 → 1/(2·2) each.
		const w = declusterWeights(samples, { x: 20, y: 20, z: null });
		expectAllAbsClose(w, [1 / 8, 1 / 8, 1 / 8, 1 / 8, 1 / 4, 1 / 4], 1e-15, 'weights');
		expectAbsClose(w.reduce((a, b) => a + b, 0), 1, 1e-15, 'sum');
		// Declustered mean: the clustered low values count half as much: (1+1+3+3)/8 + 10/2 = 6.
		expectAbsClose(domainStatistics(samples.map((s) => s.value), w).mean, 6, 1e-12, 'declustered mean');
	});

	it('declusterWeights(samples, null) gives equal weights summing to 1, and none for no samples', () => {
		const w = declusterWeights(samples, null);
		expectAllAbsClose(w, new Array(6).fill(1 / 6), 1e-15, 'equal');
		expect(declusterWeights([], null).length).toBe(0);
		expect(declusterWeights([], { x: 1, y: 1, z: 1 }).length).toBe(0);
	});
});
