/** A polyline in plan, [[x, y], …]. */
export type Polyline = ReadonlyArray<readonly [number, number]>;

/** Where a point projects onto a polyline. */
export interface Projection {
	/** Distance along the polyline from its first point to the foot of the perpendicular. */
	chainage: number;
	/** Signed distance from the line: positive to the right looking in the direction of increasing chainage. */
	offset: number;
	/** Index of the segment the point projects onto. */
	segment: number;
}

/**
 * Projects a plan point onto a polyline: the foot of the perpendicular on the nearest segment gives the
 * chainage (distance along the line) and the signed offset. The first and last segments are extended
 * beyond the line's ends, so a point just before the start gets a negative chainage rather than being
 * pinned to 0 (common practice for stationing). On equal distances the earlier segment wins.
 * Zero-length segments are skipped. Total for finite input: lengths and distances are scaled before they
 * are squared ({@link planDistance}), so a point at 1e160 does not overflow to Infinity, and the first
 * segment stands in should every distance still be NaN; the result may then hold non-finite numbers, which
 * `locateSounding` treats as not located.
 * @throws {RangeError} when the line has fewer than two distinct points or a coordinate is not finite
 */
export function projectOntoPolyline(line: Polyline, x: number, y: number): Projection {
	checkPolyline(line);
	if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError('point coordinates must be finite');
	const segments: { ax: number; ay: number; dx: number; dy: number; len: number; start: number; index: number }[] = [];
	let start = 0;
	for (let i = 0; i + 1 < line.length; i++) {
		const [ax, ay] = line[i];
		const dx = line[i + 1][0] - ax;
		const dy = line[i + 1][1] - ay;
		const len = planDistance(dx, dy);
		if (len > 0) segments.push({ ax, ay, dx, dy, len, start, index: i });
		start += len;
	}
	let best: Projection | undefined;
	let bestDistance = Infinity;
	segments.forEach((s, k) => {
		// t from unit vectors, so no product of two large lengths is formed.
		let t = ((x - s.ax) / s.len) * (s.dx / s.len) + ((y - s.ay) / s.len) * (s.dy / s.len);
		if (k > 0 && t < 0) t = 0;
		if (k < segments.length - 1 && t > 1) t = 1;
		const fx = s.ax + t * s.dx;
		const fy = s.ay + t * s.dy;
		const distance = planDistance(x - fx, y - fy);
		if (best === undefined || distance < bestDistance) {
			bestDistance = distance;
			// The cross product of the direction with the point's vector is negative on the right.
			const cross = (s.dx / s.len) * (y - s.ay) - (s.dy / s.len) * (x - s.ax);
			best = { chainage: s.start + t * s.len, offset: cross > 0 ? -distance : distance, segment: s.index };
		}
	});
	return best as Projection;
}

/** Length of a polyline: the sum of its segments' lengths. */
export function polylineLength(line: Polyline): number {
	let total = 0;
	for (let i = 0; i + 1 < line.length; i++) {
		total += planDistance(line[i + 1][0] - line[i][0], line[i + 1][1] - line[i][1]);
	}
	return total;
}

/**
 * Checks a section line: a list of [x, y] points with finite coordinates, at least two of them distinct.
 * @throws {RangeError} saying what is wrong
 */
export function checkPolyline(line: Polyline): void {
	if (!Array.isArray(line)) throw new RangeError('the section line must be a list of points');
	for (const p of line) {
		if (!Array.isArray(p) || p.length !== 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) {
			throw new RangeError('section line points must be [x, y] with finite coordinates');
		}
	}
	if (!(polylineLength(line) > 0)) throw new RangeError('the section line needs two distinct points');
}

/**
 * √(dx² + dy²) without overflow or underflow: both offsets are scaled by the larger before squaring. Plain
 * arithmetic and Math.sqrt only (unlike Math.hypot, whose bits are left to each JavaScript engine), so browser
 * and server agree.
 */
export function planDistance(dx: number, dy: number): number {
	const ax = Math.abs(dx);
	const ay = Math.abs(dy);
	const m = ax > ay ? ax : ay;
	if (m === 0 || !Number.isFinite(m)) return m;
	const u = ax / m;
	const v = ay / m;
	return m * Math.sqrt(u * u + v * v);
}
