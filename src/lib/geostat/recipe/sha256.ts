// Round constants: the first 32 bits of the fractional parts of the cube roots of the first 64 primes (FIPS 180-4 §4.2.2).
const K = new Uint32Array([
	0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98,
	0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786,
	0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8,
	0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13,
	0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819,
	0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a,
	0x5b9cca4f, 0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7,
	0xc67178f2
]);

/**
 * SHA-256 of a byte string (NIST FIPS 180-4, 2015, §6.2), as 64 lowercase hex digits.
 * Pure JavaScript and synchronous, so recipes hash the same way in a browser, a worker and Node.js
 * (Web Crypto's digest is asynchronous and Node's crypto is not available to the engine).
 * Strings are encoded as UTF-8 first. Does not mutate its input.
 * @throws {TypeError} if the input is neither a string nor a Uint8Array
 */
export function sha256(input: string | Uint8Array): string {
	let bytes: Uint8Array;
	if (typeof input === 'string') bytes = new TextEncoder().encode(input);
	else if (input instanceof Uint8Array) bytes = input;
	else throw new TypeError('input must be a string or a Uint8Array');

	const n = bytes.length;
	// Padding: a 1 bit, zeros, then the message length in bits as a 64-bit big-endian integer (§5.1.1).
	const blocks = Math.ceil((n + 9) / 64);
	const m = new Uint8Array(blocks * 64);
	m.set(bytes);
	m[n] = 0x80;
	const bitLenHi = Math.floor(n / 0x20000000);
	const bitLenLo = (n * 8) >>> 0;
	const view = new DataView(m.buffer);
	view.setUint32(m.length - 8, bitLenHi);
	view.setUint32(m.length - 4, bitLenLo);

	const h = new Uint32Array([0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19]);
	const w = new Uint32Array(64);
	for (let b = 0; b < blocks; b++) {
		for (let t = 0; t < 16; t++) w[t] = view.getUint32(b * 64 + t * 4);
		for (let t = 16; t < 64; t++) {
			const x = w[t - 15];
			const y = w[t - 2];
			const s0 = ((x >>> 7) | (x << 25)) ^ ((x >>> 18) | (x << 14)) ^ (x >>> 3);
			const s1 = ((y >>> 17) | (y << 15)) ^ ((y >>> 19) | (y << 13)) ^ (y >>> 10);
			w[t] = (w[t - 16] + s0 + w[t - 7] + s1) >>> 0;
		}
		let a = h[0], bb = h[1], c = h[2], d = h[3], e = h[4], f = h[5], g = h[6], hh = h[7];
		for (let t = 0; t < 64; t++) {
			const S1 = ((e >>> 6) | (e << 26)) ^ ((e >>> 11) | (e << 21)) ^ ((e >>> 25) | (e << 7));
			const ch = (e & f) ^ (~e & g);
			const t1 = (hh + S1 + ch + K[t] + w[t]) >>> 0;
			const S0 = ((a >>> 2) | (a << 30)) ^ ((a >>> 13) | (a << 19)) ^ ((a >>> 22) | (a << 10));
			const maj = (a & bb) ^ (a & c) ^ (bb & c);
			const t2 = (S0 + maj) >>> 0;
			hh = g;
			g = f;
			f = e;
			e = (d + t1) >>> 0;
			d = c;
			c = bb;
			bb = a;
			a = (t1 + t2) >>> 0;
		}
		h[0] += a; h[1] += bb; h[2] += c; h[3] += d; h[4] += e; h[5] += f; h[6] += g; h[7] += hh;
	}
	let hex = '';
	for (let i = 0; i < 8; i++) hex += h[i].toString(16).padStart(8, '0');
	return hex;
}
