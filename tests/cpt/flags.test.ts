import { describe, expect, it } from 'vitest';
import { CptFlag, describeFlags } from '$lib/cpt';

describe('describeFlags(mask)', () => {
	it('describeFlags(mask) names the bits set, in bit order', () => {
		expect(describeFlags(0)).toEqual([]);
		expect(describeFlags(CptFlag.drOutOfRange | CptFlag.missingReading)).toEqual(['missingReading', 'drOutOfRange']);
		const all = Object.values(CptFlag).reduce((a, b) => a | b, 0);
		expect(describeFlags(all)).toEqual(Object.keys(CptFlag));
		// Every flag is a distinct single bit.
		const bits = Object.values(CptFlag);
		expect(new Set(bits).size).toBe(bits.length);
		for (const b of bits) expect(b & (b - 1)).toBe(0);
	});
});
