import { endianness } from 'node:os';

// BLOBs are little-endian Float64; every platform we run on is little-endian, so a byte copy suffices.
if (endianness() !== 'LE') throw new Error('Float64 BLOB columns assume a little-endian platform');

/** A Float64 column as a BLOB (a copy of its bytes). */
export function toFloat64Blob(values: ArrayLike<number>): Buffer {
	const array = values instanceof Float64Array ? values : Float64Array.from(values);
	return Buffer.from(array.buffer.slice(array.byteOffset, array.byteOffset + array.byteLength));
}

/** A Float64 BLOB back as a Float64Array (copied, so it is aligned and owns its memory). */
export function fromFloat64Blob(blob: Uint8Array): Float64Array {
	if (blob.byteLength % 8 !== 0) throw new RangeError('Float64 BLOB length is not a multiple of 8');
	const out = new Float64Array(blob.byteLength / 8);
	new Uint8Array(out.buffer).set(blob);
	return out;
}
