import { interpolateAlongChainage } from './interpolate-along-chainage';
import { triangulatedSurface } from './triangulated-surface';
import { zoneOf, type BoundaryLine } from './zone-of';
import { projectOntoPolyline, type Polyline } from './project-onto-polyline';
import { WHOLE_UNIT, type Member } from './members-overlap';

/** One axis of a target grid: cells of size `cell` from `from` until they cover `to`. */
export interface GridAxis {
	from: number;
	to: number;
	cell: number;
}

/** A target grid over the site: a section (chainage × elevation) in 2D, a block (x × y × elevation) in 3D. */
export type GridSpec =
	| { geometry: '2d'; chainage: GridAxis; elevation: GridAxis }
	| { geometry: '3d'; x: GridAxis; y: GridAxis; elevation: GridAxis };

/**
 * A regular grid as the engine's recipe takes it: cell centres origin + index·spacing, x fastest, then y, then z.
 * With variable cell heights (a rectilinear grid) `z` lists the centres and `zEdges` the cell edges along the
 * elevation, ascending; origin.z and spacing.z then stand for the first centre and the smallest height.
 */
export interface GridDefinition {
	origin: { x: number; y: number; z: number };
	spacing: { x: number; y: number; z: number };
	counts: { x: number; y: number; z: number };
	z?: number[];
	zEdges?: number[];
}

/** The elevation of a grid's cell row k: the listed centre of a rectilinear grid, else origin + k·spacing. */
export function cellElevation(grid: GridDefinition, k: number): number {
	return grid.z ? grid.z[k] : grid.origin.z + k * grid.spacing.z;
}

/** A sounding as the stratigraphy stands at it. */
export interface StratigraphyStation {
	name: string;
	/** Section chainage (2D, and zones in 3D); null when the sounding is not located in the section. */
	chainage: number | null;
	x: number | null;
	y: number | null;
	ground: number;
	/** Top elevation of each unit, in stacking order; NaN where the unit is absent at this sounding. */
	tops: number[];
}

/** What the cells' domains are read from: the units in stacking order, the soundings and the zone boundaries. */
export interface GridStratigraphy {
	/** Plan polyline of the section; in 3D it gives each column the chainage its zones are counted in. */
	sectionLine: Polyline | null;
	/** The units, top of the stack first. */
	units: { id: string; name: string }[];
	stations: StratigraphyStation[];
	/** Zone boundaries of each unit, in the order of `units`. */
	boundaries: BoundaryLine[][];
}

/** Cells along an axis: enough to cover [from, to], at least one (a hair of tolerance for decimal input). */
export function axisCount(a: GridAxis): number {
	return Math.max(1, Math.ceil((a.to - a.from) / a.cell - 1e-9));
}

/**
 * The engine's grid of a grid spec: the first cell centre at `from` + cell/2 on each axis. In 2D x is the
 * chainage and y is 0 with one cell along it (the conditioning data of a 2D domain have x = chainage, y = 0).
 * @throws {RangeError} on a cell that is not > 0, or `to` not above `from`
 */
export function gridDefinition(spec: GridSpec): GridDefinition {
	const axes = spec.geometry === '2d' ? [spec.chainage, spec.elevation] : [spec.x, spec.y, spec.elevation];
	for (const a of axes) {
		if (!(a.cell > 0) || !Number.isFinite(a.cell)) throw new RangeError('cell sizes must be > 0');
		if (!(a.to > a.from) || !Number.isFinite(a.from) || !Number.isFinite(a.to)) throw new RangeError('each axis must run from a lower to a higher value');
	}
	const x = spec.geometry === '2d' ? spec.chainage : spec.x;
	const y = spec.geometry === '2d' ? null : spec.y;
	const z = spec.elevation;
	return {
		origin: { x: x.from + x.cell / 2, y: y ? y.from + y.cell / 2 : 0, z: z.from + z.cell / 2 },
		spacing: { x: x.cell, y: y ? y.cell : 1, z: z.cell },
		counts: { x: axisCount(x), y: y ? axisCount(y) : 1, z: axisCount(z) }
	};
}

/**
 * The domain of every cell of a target grid (index into `domains`; −1: not simulated), in the engine's target
 * order, read from the stratigraphy as the section draws it (see domainReader), at cell centres computed as the
 * engine computes its targets (origin + index·spacing). Soundings without a chainage (2D) or without
 * easting/northing (3D) are left out and named in `warnings`. Not mutating.
 * @throws {RangeError} as gridDefinition
 */
export function gridDomains(strat: GridStratigraphy, domains: Member[][], spec: GridSpec): { grid: GridDefinition; domain: Int32Array; warnings: string[] } {
	const grid = gridDefinition(spec);
	const { origin, spacing, counts } = grid;
	const xs = Array.from({ length: counts.x }, (_, i) => origin.x + i * spacing.x);
	const ys = Array.from({ length: counts.y }, (_, j) => origin.y + j * spacing.y);
	const zs = Array.from({ length: counts.z }, (_, k) => origin.z + k * spacing.z);
	const { domain, warnings } = axesDomains(strat, domains, spec.geometry, xs, ys, zs);
	return { grid, domain, warnings };
}

/**
 * The domain of every cell of a grid given by its cell centres per axis (ascending), x fastest, then y, then z,
 * as gridDomains reads them (the rectilinear grids of variable cell heights). In 2D `ys` is [0]. Not mutating.
 */
export function axesDomains(
	strat: GridStratigraphy,
	domains: Member[][],
	geometry: '2d' | '3d',
	xs: ArrayLike<number>,
	ys: ArrayLike<number>,
	zs: ArrayLike<number>
): { domain: Int32Array; warnings: string[] } {
	const [nx, ny, nz] = [xs.length, ys.length, zs.length];
	const domain = new Int32Array(nx * ny * nz).fill(-1);
	const reader = domainReader(strat, domains, geometry);
	for (let j = 0; j < ny; j++) {
		for (let i = 0; i < nx; i++) {
			const column = reader.column(xs[i], ys[j]);
			if (!column) continue;
			for (let k = 0; k < nz; k++) {
				const z = zs[k];
				if (z > column.ground) break;
				domain[i + nx * (j + ny * k)] = column.domainAt(z);
			}
		}
	}
	return { domain, warnings: reader.warnings };
}

/**
 * The domain of each point (x, y, z) as gridDomains reads a cell centre (an uploaded mesh's element centroids;
 * in 2D x is the chainage and y is ignored). Not mutating.
 */
export function pointDomains(
	strat: GridStratigraphy,
	domains: Member[][],
	geometry: '2d' | '3d',
	points: { x: ArrayLike<number>; y: ArrayLike<number>; z: ArrayLike<number> }
): { domain: Int32Array; warnings: string[] } {
	const n = points.x.length;
	const domain = new Int32Array(n).fill(-1);
	const reader = domainReader(strat, domains, geometry);
	for (let p = 0; p < n; p++) {
		const column = reader.column(points.x[p], geometry === '2d' ? 0 : points.y[p]);
		if (column && points.z[p] <= column.ground) domain[p] = column.domainAt(points.z[p]);
	}
	return { domain, warnings: reader.warnings };
}

/** The stratigraphy at one plan position: ground, each unit's top (NaN where absent) and the domain at an elevation. */
export interface StratigraphyColumn {
	ground: number;
	/** Each unit's top here, in stacking order (NaN where the unit is absent), after pinching out. */
	tops: Float64Array;
	/** Domain index at elevation z (−1: not simulated); z above the ground is not checked. */
	domainAt(z: number): number;
}

/**
 * Reads the stratigraphy at any plan position, as the section draws it:
 * - each unit's top and the ground surface are interpolated between the soundings — linearly along chainage
 *   in 2D (interpolateAlongChainage), linearly over the Delaunay triangles of the soundings in plan in 3D
 *   (triangulatedSurface);
 * - where a unit is absent at a sounding but a unit below it is present there, the unit pinches out at that
 *   sounding: its top is taken at the top of the next present unit below (zero thickness), so it thins out
 *   linearly towards that sounding instead of ending abruptly (common practice in drawing sections). A sounding
 *   with no unit present below an absent one (it stopped above it) does not constrain that unit;
 * - a point takes the unit whose top is the nearest at or above it, as the CPT derivation assigns readings
 *   ($lib/cpt derive); its zone is zoneOf at its chainage and elevation; the zonation's members map
 *   (unit, zone) to a domain;
 * - a point above the first unit, in a unit or zone no domain takes, or (3D) in a zoned unit without a section
 *   line to count zones along, is not simulated (−1); `column` is null where there is no ground surface.
 * `warnings` names soundings left out (no chainage in 2D, no easting/northing in 3D) and units without contacts.
 */
export function domainReader(
	strat: GridStratigraphy,
	domains: Member[][],
	geometry: '2d' | '3d'
): { warnings: string[]; column(x: number, y: number): StratigraphyColumn | null } {
	const warnings: string[] = [];
	const nu = strat.units.length;
	const is2d = geometry === '2d';
	const stations = strat.stations.filter((s) => {
		const placed = is2d ? s.chainage !== null && Number.isFinite(s.chainage) : s.x !== null && s.y !== null && Number.isFinite(s.x) && Number.isFinite(s.y);
		if (!placed) warnings.push(`${s.name} has no ${is2d ? 'chainage' : 'easting/northing'} and does not shape the grid.`);
		return placed;
	});
	if (stations.length === 0) {
		warnings.push('No located sounding: no cell can be placed in a unit.');
		return { warnings, column: () => null };
	}

	const unitIndex = new Map(strat.units.map((u, k) => [u.id, k]));
	const whole = new Int32Array(nu).fill(-1);
	const byZone: Map<number, number>[] = strat.units.map(() => new Map());
	domains.forEach((members, d) => {
		for (const m of members) {
			const k = unitIndex.get(m.unitId);
			if (k === undefined) continue;
			if (m.zone === WHOLE_UNIT) whole[k] = d;
			else byZone[k].set(m.zone, d);
		}
	});

	// Each station's effective tops: an absent unit pinches out on the next present unit below it.
	const effective = stations.map((s) => {
		const tops = new Float64Array(nu).fill(NaN);
		let below = NaN;
		for (let k = nu - 1; k >= 0; k--) {
			const t = s.tops[k];
			if (Number.isFinite(t)) below = t;
			tops[k] = Number.isFinite(t) ? t : below;
		}
		return tops;
	});
	const surfaces: ((x: number, y: number) => number)[] = [];
	for (let k = 0; k <= nu; k++) {
		const points: { c: number; x: number; y: number; v: number }[] = [];
		stations.forEach((s, i) => {
			const v = k === nu ? s.ground : effective[i][k];
			if (Number.isFinite(v)) points.push({ c: s.chainage ?? NaN, x: s.x ?? NaN, y: s.y ?? NaN, v });
		});
		if (points.length === 0) surfaces.push(() => NaN);
		else if (is2d) {
			const st = points.map((p) => ({ chainage: p.c, value: p.v }));
			surfaces.push((x) => interpolateAlongChainage(st, x));
		} else surfaces.push(triangulatedSurface(points.map((p) => ({ x: p.x, y: p.y, value: p.v }))));
	}
	for (let k = 0; k < nu; k++) {
		if (!stations.some((_, i) => Number.isFinite(effective[i][k])) && (whole[k] >= 0 || byZone[k].size > 0)) {
			warnings.push(`${strat.units[k].name} has no contacts: no cell lies in it.`);
		}
	}

	const zoned = strat.boundaries.map((b) => b.length > 0);
	let warnedNoLine = false;
	return {
		warnings,
		column(x, y) {
			const ground = surfaces[nu](x, y);
			if (!Number.isFinite(ground)) return null;
			let chainage: number | null = is2d ? x : null;
			if (!is2d && strat.sectionLine && strat.sectionLine.length >= 2) chainage = projectOntoPolyline(strat.sectionLine, x, y).chainage;
			const tops = new Float64Array(nu);
			const order: number[] = [];
			for (let k = 0; k < nu; k++) {
				tops[k] = surfaces[k](x, y);
				if (Number.isFinite(tops[k])) order.push(k);
			}
			// Highest top first; equal tops keep the stacking order, so a unit of zero thickness takes no cell.
			order.sort((a, b) => tops[b] - tops[a] || a - b);
			return {
				ground,
				tops,
				domainAt(z) {
					let unit = -1;
					for (const k of order) {
						if (tops[k] >= z) unit = k;
						else break;
					}
					if (unit < 0) return -1;
					let d = whole[unit];
					if (d < 0 && byZone[unit].size > 0) {
						if (zoned[unit] && chainage === null) {
							if (!warnedNoLine) warnings.push('Zoned units need a section line in 3D to count zones along; their cells are not simulated.');
							warnedNoLine = true;
							return -1;
						}
						const zone = zoned[unit] ? zoneOf(strat.boundaries[unit], chainage!, z) : 0;
						d = byZone[unit].get(zone) ?? -1;
					}
					return d;
				}
			};
		}
	};
}

/** Run-length encoding of domain indices in target order, as [domain, count] pairs (the recipe's domainRuns). */
export function domainRuns(domain: ArrayLike<number>): [number, number][] {
	const runs: [number, number][] = [];
	for (let i = 0; i < domain.length; i++) {
		const last = runs[runs.length - 1];
		if (last && last[0] === domain[i]) last[1]++;
		else runs.push([domain[i], 1]);
	}
	return runs;
}

/** Number of cells of each domain (index 0 … n − 1). */
export function cellsPerDomain(domain: ArrayLike<number>, n: number): number[] {
	const out = new Array<number>(n).fill(0);
	for (let i = 0; i < domain.length; i++) if (domain[i] >= 0 && domain[i] < n) out[domain[i]]++;
	return out;
}
