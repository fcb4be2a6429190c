import { describe, expect, it } from 'vitest';
import { describeReading, readContactBlock, type BlockOptions } from '../../../../../src/routes/projects/[id]/stratigraphy/contact-block';

const soundings = [
	{ id: 's1', name: 'LV-01', groundElevation: 4 },
	{ id: 's2', name: 'LV-02', groundElevation: 4.2 },
	{ id: 's3', name: 'LV-03', groundElevation: 4.4 }
];
const units = [
	{ id: 'clay', name: 'Overbank clay' },
	{ id: 'sand', name: 'Point-bar sand' },
	{ id: 'dense', name: 'Dense sand' }
];
const base: BlockOptions = { soundings, units, start: { row: 0, unit: 1 }, current: new Map() };

describe('readContactBlock(text, options)', () => {
	it('readContactBlock fills the table from the cell pasted into, row by row and column by column (tab-separated)', () => {
		const r = readContactBlock('2.31\t-6.09\n2,07\t−6.27\n', base);
		expect(r.rows).toBe(2);
		expect(r.columns).toBe(2);
		expect(r.byName).toEqual({ soundings: false, units: false });
		expect(r.set.map((c) => [c.soundingName, c.unitId, c.top])).toEqual([
			['LV-01', 'sand', 2.31],
			['LV-01', 'dense', -6.09],
			['LV-02', 'sand', 2.07],
			['LV-02', 'dense', -6.27]
		]);
		expect(r.problems).toEqual([]);
	});

	it('readContactBlock places rows by sounding name and columns by a header of unit names, leaving other columns out', () => {
		const text = 'Sounding\tchainage (m)\tDense sand top (m)\tPoint-bar sand\nLV-03\t40.7\t-6.59\t1.55\nLV-99\t50\t-7\t1\nLV-01\t9.8\t-6.09\t2.31\n';
		const r = readContactBlock(text, { ...base, start: { row: 2, unit: 2 } });
		expect(r.byName).toEqual({ soundings: true, units: true });
		expect(r.ignoredColumns).toEqual(['chainage (m)']);
		expect(r.unknownSoundings).toEqual(['LV-99']);
		expect(r.set.map((c) => `${c.soundingName} ${c.unitId} ${c.top}`)).toEqual(['LV-03 dense -6.59', 'LV-03 sand 1.55', 'LV-01 dense -6.09', 'LV-01 sand 2.31']);
	});

	it('readContactBlock reads empty cells and dashes as absent units, and tells unchanged tops from changed ones', () => {
		const current = new Map([
			['s1|sand', { top: 2.31, interpolated: false }],
			['s1|dense', { top: -6, interpolated: false }],
			['s2|sand', { top: 2.07, interpolated: true }]
		]);
		const r = readContactBlock('2.31\t\n2.07\t—\n\t-7\n', { ...base, current });
		expect(r.unchanged).toBe(3); // LV-01 sand as stored; LV-02 dense and LV-03 sand absent and not stored
		expect(r.remove.map((c) => [c.soundingName, c.unitId, c.before])).toEqual([['LV-01', 'dense', -6]]);
		// An interpolated top typed as it stands becomes measured: it is set.
		expect(r.set.map((c) => [c.soundingName, c.unitId, c.top])).toEqual([
			['LV-02', 'sand', 2.07],
			['LV-03', 'dense', -7]
		]);
	});

	it('readContactBlock turns depths into elevations with each sounding ground elevation', () => {
		const r = readContactBlock('1.7\n2.1\n', { ...base, asDepths: true });
		expect(r.set.map((c) => c.top)).toEqual([2.3, 2.1]); // 4 − 1.7, 4.2 − 2.1, to the millimetre
	});

	it('readContactBlock reads a single column of values by position, even when some are not numbers', () => {
		const r = readContactBlock('2.0\nabc\n', base);
		expect(r.byName.soundings).toBe(false);
		expect(r.set.map((c) => [c.soundingName, c.top])).toEqual([['LV-01', 2]]);
		expect(r.problems).toEqual(['LV-02, Point-bar sand: “abc” is not a number.']);
	});

	it('readContactBlock counts values beyond the table and names cells that are not numbers', () => {
		const r = readContactBlock('1\t2\t3\nx\t2\t3\n1\t2\t3\n1\t2\t3\n', base);
		expect(r.outside).toBe(3 + 3); // a third value column on the three rows in the table, and the fourth row
		expect(r.problems).toEqual(['LV-02, Point-bar sand: “x” is not a number.']);
	});

	it('readContactBlock reads comma- and semicolon-separated text with quoted names', () => {
		const r = readContactBlock('"LV-02",1.5,-6\n', base);
		expect(r.byName.soundings).toBe(true);
		expect(r.set.map((c) => [c.soundingName, c.unitId, c.top])).toEqual([
			['LV-02', 'sand', 1.5],
			['LV-02', 'dense', -6]
		]);
		expect(readContactBlock('LV-03;1,5;-6\n', base).set.map((c) => c.top)).toEqual([1.5, -6]);
	});

	it('describeReading says what was read and what saving will do', () => {
		const current = new Map([['s1|dense', { top: -6, interpolated: false }]]);
		const text = describeReading(readContactBlock('Sounding\tsource\tDense sand\nLV-01\tx\t\nLV-02\ty\t-6.3\n', { ...base, current }));
		expect(text).toBe(
			'Read 2 soundings × 1 unit (rows by sounding name, columns by unit name). 1 top to set, 1 contact to remove (empty cells: the unit is absent there). Left out the column “source”.'
		);
	});
});
