import type { Recipe } from './schema';

/**
 * The same recipe with a points target's columns as typed arrays (x, y, z as Float64Array, domain as Int32Array);
 * other recipes are returned as they are. Its canonical JSON, so its hash, does not change, nor does a bit of any
 * realization. What changes is memory: a million targets take 28 MB instead of about 32 MB of parsed JSON arrays,
 * and the engine uses typed columns as they are instead of copying them. With `shared`, the columns live in
 * SharedArrayBuffers, so a worker that receives the recipe reads the same memory instead of a copy (where
 * SharedArrayBuffer exists: Node.js, or a cross-origin isolated page).
 * Does not mutate its input.
 */
export function withTypedPoints(recipe: Recipe, { shared = false }: { shared?: boolean } = {}): Recipe {
	const t = recipe.targets;
	if (t.kind !== 'points') return recipe;
	const n = t.x.length;
	const f64 = (a: ArrayLike<number>) => {
		const out = float64Column(n, shared);
		out.set(a);
		return out;
	};
	const domain = int32Column(n, shared);
	domain.set(t.domain);
	return { ...recipe, targets: { kind: 'points', x: f64(t.x), y: f64(t.y), z: f64(t.z), domain } } as Recipe;
}

/** A coordinate column of n targets, in a SharedArrayBuffer when `shared`. */
export function float64Column(n: number, shared: boolean): Float64Array {
	return new Float64Array(shared ? new SharedArrayBuffer(8 * n) : new ArrayBuffer(8 * n));
}

/** A domain column of n targets, in a SharedArrayBuffer when `shared`. */
export function int32Column(n: number, shared: boolean): Int32Array {
	return new Int32Array(shared ? new SharedArrayBuffer(4 * n) : new ArrayBuffer(4 * n));
}
