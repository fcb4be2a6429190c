import { describe, expect, it } from 'vitest';
import { membersOverlap, WHOLE_UNIT } from '../../src/lib/site/index';

describe('membersOverlap(a, b)', () => {
	it('membersOverlap(a, b) treats the whole unit as overlapping each of its zones', () => {
		expect(WHOLE_UNIT).toBe(-1);
		expect(membersOverlap({ unitId: 'u', zone: WHOLE_UNIT }, { unitId: 'u', zone: 1 })).toBe(true);
		expect(membersOverlap({ unitId: 'u', zone: 1 }, { unitId: 'u', zone: WHOLE_UNIT })).toBe(true);
		expect(membersOverlap({ unitId: 'u', zone: WHOLE_UNIT }, { unitId: 'u', zone: WHOLE_UNIT })).toBe(true);
	});

	it('membersOverlap(a, b) is true for the same zone only, and never across units', () => {
		expect(membersOverlap({ unitId: 'u', zone: 1 }, { unitId: 'u', zone: 1 })).toBe(true);
		expect(membersOverlap({ unitId: 'u', zone: 0 }, { unitId: 'u', zone: 1 })).toBe(false);
		expect(membersOverlap({ unitId: 'u', zone: 0 }, { unitId: 'v', zone: 0 })).toBe(false);
		expect(membersOverlap({ unitId: 'u', zone: WHOLE_UNIT }, { unitId: 'v', zone: WHOLE_UNIT })).toBe(false);
	});
});
