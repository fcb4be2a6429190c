import { describe, expect, it } from 'vitest';
import { formatDelimited, formatGef, type DelimitedMapping, type ParsedSounding } from '../../../src/lib/cpt';
import { mappingFor, parseUpload, type UploadedFile } from '../../../src/lib/server/services/import-parse';
import { READINGS_PER_SOUNDING_MAX } from '../../../src/lib/schemas/bounds';

const MAPPING: DelimitedMapping = { id: 'sounding', depth: 'depth (m)', qc: 'qc (MPa)', fs: 'fs (kPa)', units: { depth: 'm', qc: 'MPa', fs: 'kPa' }, groundElevation: { value: 1 } };
const file = (name: string, text: string): UploadedFile => ({ name, bytes: new TextEncoder().encode(text) });

function sounding(over: Partial<ParsedSounding> = {}, n = 5, step = 0.02): ParsedSounding {
	const depth = Float64Array.from({ length: n }, (_, i) => Math.round((i + 1) * step * 1000) / 1000);
	return { id: 'S-1', x: 1000, y: 2000, groundElevation: 3, areaRatio: 0.8, depth, qc: depth.map(() => 2000), fs: depth.map(() => 20), ...over };
}

describe('mappingFor(file, request)', () => {
	it('mappingFor takes only an own property of mappings, never an inherited object member', () => {
		for (const name of ['toString', 'constructor', 'hasOwnProperty', 'valueOf']) {
			expect(mappingFor({ name, bytes: new Uint8Array() }, { mapping: MAPPING, mappings: {} })).toBe(MAPPING);
			expect(mappingFor({ name, bytes: new Uint8Array() }, { mappings: {} })).toBeUndefined();
		}
		const own = { ...MAPPING, delimiter: ';' as const };
		expect(mappingFor({ name: 'toString', bytes: new Uint8Array() }, { mapping: MAPPING, mappings: { toString: own } })).toBe(own);
	});
});

describe('parseUpload(request) limits', () => {
	const codeOf = (f: UploadedFile, mapping?: DelimitedMapping) => parseUpload({ files: [f], mapping }).problems[0]?.code;

	it('parseUpload accepts a sounding at the limits', () => {
		const edge = sounding({ id: 'E'.repeat(100), x: 1e8, y: -1e8, groundElevation: -30000 });
		expect(parseUpload({ files: [file('edge.gef', formatGef(edge))] }).problems).toEqual([]);
	});

	it('parseUpload refuses coordinates, elevations and depths beyond the bounds, naming the column', () => {
		const cases: [Partial<ParsedSounding>, string][] = [
			[{ x: 1.5e8 }, 'x'],
			[{ y: -1e160 }, 'y'],
			[{ groundElevation: 30001 }, 'ground elevation'],
			[{ depth: Float64Array.from([1, 2, 1001]), qc: Float64Array.from([1, 1, 1]), fs: Float64Array.from([1, 1, 1]) }, 'depth']
		];
		for (const [over, column] of cases) {
			const { problems } = parseUpload({ files: [file('far.gef', formatGef(sounding(over)))] });
			expect(problems[0], column).toMatchObject({ code: 'out-of-bounds', column });
		}
	});

	it('parseUpload refuses a name over 100 characters or without a visible character', () => {
		expect(codeOf(file('long.gef', formatGef(sounding({ id: 'L'.repeat(101) }))))).toBe('name-too-long');
		expect(codeOf(file('zw.csv', formatDelimited([sounding({ id: '\u200b\u2060\ufeff' })])), MAPPING)).toBe('no-visible-name');
	});

	it(`parseUpload refuses a sounding of more than ${READINGS_PER_SOUNDING_MAX} readings`, () => {
		const big = sounding({}, READINGS_PER_SOUNDING_MAX + 1, 0.005);
		expect(codeOf(file('big.csv', formatDelimited([big])), MAPPING)).toBe('too-many-readings');
		const fits = sounding({}, READINGS_PER_SOUNDING_MAX, 0.005);
		expect(codeOf(file('fits.csv', formatDelimited([fits])), MAPPING)).toBeUndefined();
	});
});
