import { describe, expect, it } from 'vitest';
import { CptParseError, MAX_FILE_BYTES, assertFileSize } from '$lib/cpt';

describe('CptParseError', () => {
	it('new CptParseError(init) formats file, line and column into its message and keeps them as fields', () => {
		const e = new CptParseError({ code: 'not-a-number', file: 'a.csv', line: 17, column: 'qc', detail: "'abc' is not a number" });
		expect(e).toBeInstanceOf(Error);
		expect(e.name).toBe('CptParseError');
		expect(e.message).toBe("a.csv: line 17, column qc: 'abc' is not a number");
		expect([e.code, e.file, e.line, e.column, e.detail]).toEqual(['not-a-number', 'a.csv', 17, 'qc', "'abc' is not a number"]);
		expect(new CptParseError({ code: 'malformed', line: 3, detail: 'x' }).message).toBe('line 3: x');
		expect(new CptParseError({ code: 'file-too-large', detail: 'too big' }).message).toBe('too big');
	});
});

describe('assertFileSize(byteLength, file)', () => {
	it('assertFileSize(byteLength) accepts 50 MB and rejects one byte more', () => {
		expect(MAX_FILE_BYTES).toBe(50 * 1024 * 1024);
		expect(() => assertFileSize(MAX_FILE_BYTES)).not.toThrow();
		try {
			assertFileSize(MAX_FILE_BYTES + 1, 'big.gef');
			expect.fail('expected a throw');
		} catch (e) {
			expect(e).toBeInstanceOf(CptParseError);
			expect((e as CptParseError).code).toBe('file-too-large');
			expect((e as CptParseError).file).toBe('big.gef');
			expect((e as CptParseError).line).toBeUndefined();
			expect((e as Error).message).toBe('big.gef: file is 50.0 MB, over the 50 MB limit');
		}
	});
});
