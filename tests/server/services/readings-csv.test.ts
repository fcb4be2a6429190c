import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { deriveSounding } from '../../../src/lib/server/services/derived';
import { importSoundings } from '../../../src/lib/server/services/import';
import { readingsCsv } from '../../../src/lib/server/services/readings-csv';
import { testProject } from './soundings-db';

describe('readingsCsv(results, lengthUnit)', () => {
	it('readingsCsv writes a header with units, one row per reading and quotes a name holding a comma (RFC 4180)', async () => {
		const t = await testProject();
		const gef =
			'#GEFID= 1, 1, 0\n#TESTID= CPT 7, north\n#COLUMN= 3\n#COLUMNINFO= 1, m, penetration length, 1\n#COLUMNINFO= 2, MPa, cone resistance, 2\n' +
			'#COLUMNINFO= 3, MPa, local friction, 3\n#ZID= 0, 2.5, 0\n#EOH=\n1.00 1.5 0.015\n2.00 2.0 0.02\n';
		const [file] = importSoundings(t.projectId, t.userId, { files: [{ name: 'c.gef', bytes: new TextEncoder().encode(gef) }] }, t.db).files;
		const result = deriveSounding(t.projectId, file.soundings[0].id, t.db);
		const text = [...readingsCsv([result], 'm')].join('');
		const rows = parse(text, { columns: true }) as Record<string, string>[];
		expect(rows).toHaveLength(2);
		expect(Object.keys(rows[0]).slice(0, 12)).toEqual([
			'sounding', 'easting (m)', 'northing (m)', 'chainage (m)', 'ground elevation (m)', 'depth (m)', 'elevation (m)', 'unit', 'qc (kPa)', 'fs (kPa)', 'u2 (kPa)', 'qt (kPa)'
		]);
		expect(rows[0]).toMatchObject({ sounding: 'CPT 7, north', 'depth (m)': '1.000', 'elevation (m)': '1.500', 'qc (kPa)': '1500', 'u2 (kPa)': '', 'ground elevation (m)': '2.50' });
		// No u2: qt = qc (Lunne et al. 1997, qt = qc + u2(1 − a)).
		expect(rows[1]['qt (kPa)']).toBe('2000');
		expect(Object.keys(rows[0])).toEqual(expect.arrayContaining(['σ′v (kPa)', 'Ic', 'qc1Ncs', 'su/σ′v', 'FC (%)', 'Fr (%)', 'flags']));
	});
});
