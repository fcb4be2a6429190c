import { Delaunay } from 'd3';
import { interpolateAlongChainage } from './interpolate-along-chainage';

/** A value known at a plan point; NaN marks a unit absent there. */
export interface PlanPoint {
	x: number;
	y: number;
	value: number;
}

/**
 * A surface through plan points, e.g. a unit's top over the soundings of a 3D site: linear on the triangles
 * of their Delaunay triangulation (d3-delaunay), i.e. barycentric interpolation inside each triangle; the
 * nearest point's value outside the convex hull. Points that all lie on one line are interpolated along that
 * line instead. A triangle with a NaN corner gives NaN (the unit is absent there). Duplicate points keep the
 * first value. Not mutating.
 * @throws {RangeError} on no points or a non-finite coordinate
 */
export function triangulatedSurface(points: ReadonlyArray<PlanPoint>): (x: number, y: number) => number {
	if (points.length === 0) throw new RangeError('no points');
	for (const p of points) if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) throw new RangeError('coordinates must be finite');
	const pts = points.map((p) => ({ ...p }));
	if (pts.length === 1) return () => pts[0].value;
	const delaunay = Delaunay.from(pts, (p) => p.x, (p) => p.y);
	const t = delaunay.triangles;
	// d3-delaunay jitters collinear input into sliver triangles and marks it `collinear` (a field its types omit); slivers would interpolate badly.
	if (t.length === 0 || (delaunay as unknown as { collinear?: Int32Array }).collinear) return alongLine(pts);
	// Relative to the triangle's size, so huge map coordinates do not defeat the inside test.
	const EPS = 1e-12;
	return (x, y) => {
		for (let k = 0; k < t.length; k += 3) {
			const a = pts[t[k]];
			const b = pts[t[k + 1]];
			const c = pts[t[k + 2]];
			const det = (b.y - c.y) * (a.x - c.x) + (c.x - b.x) * (a.y - c.y);
			const l1 = ((b.y - c.y) * (x - c.x) + (c.x - b.x) * (y - c.y)) / det;
			const l2 = ((c.y - a.y) * (x - c.x) + (a.x - c.x) * (y - c.y)) / det;
			const l3 = 1 - l1 - l2;
			if (l1 >= -EPS && l2 >= -EPS && l3 >= -EPS) return l1 * a.value + l2 * b.value + l3 * c.value;
		}
		return pts[delaunay.find(x, y)].value;
	};
}

/** All points on one line: positions measured along the direction from the first to the farthest point. */
function alongLine(pts: PlanPoint[]): (x: number, y: number) => number {
	const o = pts[0];
	const d2 = (p: PlanPoint) => (p.x - o.x) * (p.x - o.x) + (p.y - o.y) * (p.y - o.y);
	let far = o;
	for (const p of pts) if (d2(p) > d2(far)) far = p;
	const len = Math.sqrt(d2(far));
	if (len === 0) return () => o.value;
	const ux = (far.x - o.x) / len;
	const uy = (far.y - o.y) / len;
	const stations = pts.map((p) => ({ chainage: (p.x - o.x) * ux + (p.y - o.y) * uy, value: p.value }));
	return (x, y) => interpolateAlongChainage(stations, (x - o.x) * ux + (y - o.y) * uy);
}
