import { describe, it, expect } from 'vitest';
import { createHash } from 'node:crypto';
import seedrandom from 'seedrandom';
import { recipeHash, sha256, type Recipe } from '../../../src/lib/geostat/index';

// Test vectors of NIST FIPS 180-4 / the NIST example values for SHA-256 ("abc", the 448-bit two-block
// message, the empty string) and the one-million-'a' message (NIST, from memory, widely republished).
describe('sha256(input)', () => {
	it('sha256("abc") is the FIPS 180-4 example digest', () => {
		expect(sha256('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
	});
	it('sha256 of the 448-bit message "abcdbcde…nopq" is the FIPS 180-4 two-block example digest', () => {
		expect(sha256('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
			'248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'
		);
	});
	it('sha256("") is the NIST empty-message digest', () => {
		expect(sha256('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
		expect(sha256(new Uint8Array(0))).toBe(sha256(''));
	});
	it('sha256 of one million "a" is the NIST long-message digest (from memory)', () => {
		expect(sha256('a'.repeat(1_000_000))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
	});
	it('sha256 encodes strings as UTF-8 and pads at the 55/56/64-byte block edges consistently', () => {
		expect(sha256('é')).toBe(sha256(new Uint8Array([0xc3, 0xa9])));
		const seen = new Set<string>();
		for (const n of [55, 56, 63, 64, 65]) seen.add(sha256('x'.repeat(n)));
		expect(seen.size).toBe(5);
		expect(() => sha256(42 as unknown as string)).toThrow(TypeError);
	});
	it('sha256 equals Node\'s crypto (OpenSSL) on random byte strings of every length from 0 to 300', () => {
		const rng = seedrandom('sha256-vs-openssl');
		for (let n = 0; n <= 300; n++) {
			const bytes = Uint8Array.from({ length: n }, () => Math.floor(rng() * 256));
			expect(sha256(bytes), `n = ${n}`).toBe(createHash('sha256').update(bytes).digest('hex'));
		}
	});
});

describe('recipeHash(recipe) is unchanged by the hashing library', () => {
	// Digests written by the hand-written FIPS 180-4 implementation this engine used before @noble/hashes: a stored
	// recipe keeps its identity. The recipe is literal (engine version included), so engine changes do not move it.
	it('recipeHash of a fixed recipe and sha256 of a non-ASCII string keep their earlier digests', () => {
		const recipe = {
			engineVersion: 'conefield-sgs/1',
			input: {
				seed: 'levee-A',
				domains: [
					{
						samples: [
							{ x: 2, y: 0, z: -1, value: 3.5, sounding: 'C1' },
							{ x: 7, y: 0, z: -2, value: 5.25, sounding: 'C2' }
						],
						model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 8, rangeMinor: null, rangeVertical: 1.5 }] },
						transform: 'normal-score',
						kriging: 'simple',
						search: { maxData: 8, maxSimulated: 8 }
					}
				]
			},
			targets: { kind: 'grid', origin: { x: 0, y: 0, z: -3 }, spacing: { x: 1, y: 1, z: 0.5 }, counts: { x: 10, y: 1, z: 6 }, domainRuns: [[0, 50], [-1, 10]] }
		} as Recipe;
		expect(recipeHash(recipe)).toBe('2652cde47cfdac9e42f86875994d2b40ee09f0261586b3ec28063da52c3caccd');
		expect(sha256('Grès argileux — σ′v')).toBe('4a4dc5823e9341bdce0449df8e36492cbac906937ff7fbd394dce6b4aff4e52e');
	});
});
