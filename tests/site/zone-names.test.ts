import { describe, expect, it } from 'vitest';
import { zoneNamesOf } from '../../src/lib/site/index';

describe('zoneNamesOf(unit, boundaryCount)', () => {
	it('zoneNamesOf(unit, n) uses stored names that fit, else numbered zones', () => {
		expect(zoneNamesOf({ name: 'Sand', zoneNames: ['West', 'East'] }, 1)).toEqual(['West', 'East']);
		expect(zoneNamesOf({ name: 'Sand', zoneNames: ['West'] }, 2)).toEqual(['West', 'Zone 2', 'Zone 3']);
		expect(zoneNamesOf({ name: 'Sand', zoneNames: null }, 0)).toEqual(['Sand']);
	});

	it('zoneNamesOf(unit, 0) of a unit with one stored name uses it; with several, the unit\'s name', () => {
		expect(zoneNamesOf({ name: 'Sand', zoneNames: ['Point bar'] }, 0)).toEqual(['Point bar']);
		expect(zoneNamesOf({ name: 'Sand', zoneNames: ['West', 'East'] }, 0)).toEqual(['Sand']);
	});
});
