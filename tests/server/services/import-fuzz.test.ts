// 1 000 seeded uploads through the import service (the first 1 000 of the 10 000 that `npm run fuzz` runs).
import { describe, expect, it } from 'vitest';
import { runFuzz } from './import-fuzz';

describe('importSoundings under fuzzing (seeded, 1 000 uploads)', () => {
	it('importSoundings imports or refuses every upload whole: no crash, no partial write, and both outcomes occur', () => {
		const tally = runFuzz(0, 1000);
		expect(tally.failures).toEqual([]);
		expect(tally.crashes).toBe(0);
		expect(tally.partialWrites).toBe(0);
		expect(tally.tried).toBe(1000);
		expect(tally.accepted + tally.refused).toBe(1000);
		// The generator must exercise both paths substantially, or the test proves little.
		expect(tally.accepted).toBeGreaterThan(150);
		expect(tally.refused).toBeGreaterThan(300);
		expect(tally.codes['out-of-bounds'] ?? 0).toBeGreaterThan(0);
	}, 120_000);
});
