import { sha256 as sha256Bytes } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';

/**
 * SHA-256 of a byte string (NIST FIPS 180-4, 2015), as 64 lowercase hex digits, through @noble/hashes
 * (audited, pure JavaScript). Synchronous, so recipes hash the same way in a browser, a worker and Node.js
 * (Web Crypto's digest is asynchronous and Node's crypto is not available to the engine).
 * Strings are encoded as UTF-8 first. Does not mutate its input.
 * @throws {TypeError} if the input is neither a string nor a Uint8Array
 */
export function sha256(input: string | Uint8Array): string {
	let bytes: Uint8Array;
	if (typeof input === 'string') bytes = new TextEncoder().encode(input);
	else if (input instanceof Uint8Array) bytes = input;
	else throw new TypeError('input must be a string or a Uint8Array');
	return bytesToHex(sha256Bytes(bytes));
}
