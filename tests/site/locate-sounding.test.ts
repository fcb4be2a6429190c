import { describe, expect, it } from 'vitest';
import { locateSounding } from '../../src/lib/site/index';
import { L } from './fixtures';

describe('locateSounding(site, sounding)', () => {
	it('locateSounding(site, s) projects when it can, else uses the given chainage, and flags far soundings', () => {
		const site = { sectionLine: L, offLineTolerance: 25 };
		expect(locateSounding(site, { x: 50, y: -10, chainage: 999 })).toEqual({
			chainage: 50,
			offset: 10,
			farOffLine: false,
			source: 'projected'
		});
		expect(locateSounding(site, { x: 50, y: -30, chainage: null }).farOffLine).toBe(true);
		expect(locateSounding({ sectionLine: null, offLineTolerance: 25 }, { x: 50, y: -30, chainage: 12 })).toEqual({
			chainage: 12,
			offset: null,
			farOffLine: false,
			source: 'given'
		});
		expect(locateSounding({ sectionLine: null, offLineTolerance: 25 }, { x: 1, y: 2, chainage: null }).source).toBe('none');
	});
});
