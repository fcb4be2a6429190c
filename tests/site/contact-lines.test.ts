import { describe, expect, it } from 'vitest';
import { contactLines } from '../../src/lib/site/index';

describe('contactLines(stations)', () => {
	it('contactLines(stations) joins consecutive present stations into one polyline', () => {
		expect(
			contactLines([
				{ chainage: 0, topElevation: 2 },
				{ chainage: 40, topElevation: 1.5 },
				{ chainage: 90, topElevation: 0.5 }
			])
		).toEqual([
			[
				[0, 2],
				[40, 1.5],
				[90, 0.5]
			]
		]);
	});

	it('contactLines(stations) breaks the line where the unit is absent and keeps a lone station as a run of one', () => {
		expect(
			contactLines([
				{ chainage: 0, topElevation: 2 },
				{ chainage: 40, topElevation: null },
				{ chainage: 90, topElevation: 0.5 },
				{ chainage: 120, topElevation: 0 },
				{ chainage: 150, topElevation: null }
			])
		).toEqual([
			[[0, 2]],
			[
				[90, 0.5],
				[120, 0]
			]
		]);
	});

	it('contactLines(stations) gives no line for no stations or a unit absent everywhere, and does not mutate', () => {
		expect(contactLines([])).toEqual([]);
		const absent = [{ chainage: 0, topElevation: null }];
		expect(contactLines(absent)).toEqual([]);
		expect(absent).toEqual([{ chainage: 0, topElevation: null }]);
	});
});
