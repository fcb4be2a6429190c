/**
 * A bounded cache of solved kriging systems, keyed by their neighbourhood signature: the domain, the number of
 * entries k and the ordered list of the entries' lattice offsets from the target (as linear cell offsets). On a
 * lattice whose covariances come from a table, that signature fixes the whole system — matrix, right-hand side,
 * hence the weights and the kriging variance — so a node whose neighbourhood repeats one already solved can take
 * its weights instead of building and factoring the system again. What is stored are the very doubles the solve
 * produced, and the caller applies them with the same arithmetic in the same order, so reuse never changes a bit.
 * (The same structure keeps the data parts of factors by their data's offsets, with `width` doubles a slot
 * instead of kmax weights: see dataPartCache in prepareSimulation.)
 *
 * Layout: fixed slots of (k, domain, hash, kmax offsets) in one Int32Array and (`width` doubles — kmax weights
 * unless given —, variance) in one Float64Array, allocated on the first store. Two-way set associative (the hash
 * picks a set of two slots); a new solution takes an empty slot of its set, else the one of the two used less
 * recently (least-recently-used eviction within the set). Memory is bytesPerSlot(kmax, width) × slots, fixed when
 * the cache is made.
 */
export class SolutionCache {
	readonly kmax: number;
	/** Doubles a slot holds before its variance (kmax unless given). */
	readonly width: number;
	/** Number of slots (even: sets of two). */
	readonly slots: number;
	/** Lookups answered from the cache, and solutions stored, since the cache was made. */
	hits = 0;
	stores = 0;
	private keys: Int32Array | null = null;
	private vals: Float64Array | null = null;
	private used: Float64Array | null = null;
	private tick = 0;

	/** Bytes one slot takes for systems of up to kmax entries (and `values` doubles, default kmax). */
	static bytesPerSlot(kmax: number, values = kmax): number {
		return 4 * (3 + kmax) + 8 * (values + 1) + 8;
	}

	/**
	 * @param kmax largest number of entries of a system to cache
	 * @param slots number of slots wanted; rounded down to an even number ≥ 2
	 * @param values doubles a slot holds (default kmax: the weights)
	 * @throws {RangeError} if kmax or values is not an integer ≥ 1, or slots < 2
	 */
	constructor(kmax: number, slots: number, values = kmax) {
		if (!Number.isInteger(kmax) || kmax < 1) throw new RangeError('kmax must be an integer >= 1');
		if (!Number.isInteger(values) || values < 1) throw new RangeError('values must be an integer >= 1');
		if (!(slots >= 2)) throw new RangeError('a cache needs at least 2 slots');
		this.kmax = kmax;
		this.width = values;
		this.slots = 2 * Math.floor(slots / 2);
	}

	/** Memory the cache takes once it holds anything, in bytes. */
	get bytes(): number {
		return this.slots * SolutionCache.bytesPerSlot(this.kmax, this.width);
	}

	/**
	 * The slot holding the solution of the system with this signature, or −1. `key` holds the k offsets;
	 * `hash` is signatureHash(domain, k, key).
	 */
	find(domain: number, k: number, key: Int32Array, hash: number): number {
		const keys = this.keys;
		if (keys === null || k > this.kmax) return -1;
		const stride = 3 + this.kmax;
		const first = 2 * ((hash >>> 0) % (this.slots / 2));
		for (let s = first; s < first + 2; s++) {
			const o = s * stride;
			if (keys[o] !== k || keys[o + 1] !== domain || keys[o + 2] !== hash) continue;
			let same = true;
			for (let p = 0; p < k; p++) {
				if (keys[o + 3 + p] !== key[p]) {
					same = false;
					break;
				}
			}
			if (same) {
				this.used![s] = ++this.tick;
				this.hits++;
				return s;
			}
		}
		return -1;
	}

	/** Offset into values() of a slot's weights (its kriging variance follows them, at offset + width). */
	valueOffset(slot: number): number {
		return slot * (this.width + 1);
	}

	/** The weights and variances of all slots (see valueOffset). */
	values(): Float64Array {
		return this.vals!;
	}

	/**
	 * Stores the weights (the first `count` entries of `weights`, default k; at most width) and the kriging variance
	 * of the system with this signature.
	 */
	store(domain: number, k: number, key: Int32Array, hash: number, weights: Float64Array, variance: number, count = k): void {
		if (k > this.kmax || k < 1 || count > this.width) return;
		if (this.keys === null) {
			this.keys = new Int32Array(this.slots * (3 + this.kmax));
			this.vals = new Float64Array(this.slots * (this.width + 1));
			this.used = new Float64Array(this.slots);
		}
		const keys = this.keys;
		const used = this.used!;
		const stride = 3 + this.kmax;
		const first = 2 * ((hash >>> 0) % (this.slots / 2));
		// An empty slot (k = 0) has never been used, so its `used` tick is 0 and it loses the comparison.
		const s = used[first] <= used[first + 1] ? first : first + 1;
		const o = s * stride;
		keys[o] = k;
		keys[o + 1] = domain;
		keys[o + 2] = hash;
		for (let p = 0; p < k; p++) keys[o + 3 + p] = key[p];
		const v = s * (this.width + 1);
		const vals = this.vals!;
		for (let p = 0; p < count; p++) vals[v + p] = weights[p];
		vals[v + this.width] = variance;
		used[s] = ++this.tick;
		this.stores++;
	}
}

/** A 32-bit hash of a signature (FNV-1a over the integers, then a final avalanche as in MurmurHash3's fmix32). */
export function signatureHash(domain: number, k: number, key: Int32Array): number {
	let h = Math.imul(0x811c9dc5 ^ domain, 16777619);
	h = Math.imul(h ^ k, 16777619);
	for (let p = 0; p < k; p++) h = Math.imul(h ^ key[p], 16777619);
	h ^= h >>> 16;
	h = Math.imul(h, 0x85ebca6b);
	h ^= h >>> 13;
	h = Math.imul(h, 0xc2b2ae35);
	h ^= h >>> 16;
	return h | 0;
}
