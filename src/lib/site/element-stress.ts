import { verticalStressAt, type VerticalStress } from '../cpt/verticalStressAt';
import { domainReader, type GridStratigraphy } from './grid-domains';
import { interpolateAlongChainage } from './interpolate-along-chainage';
import { triangulatedSurface } from './triangulated-surface';

/** Where the groundwater stands at a sounding (its own elevation, else the project's, else its ground). */
export interface GroundwaterStation {
	chainage: number | null;
	x: number | null;
	y: number | null;
	groundwater: number;
}

/**
 * The vertical stresses at any point of the site, for carrying su/σ′v to su at a model's elements: the column
 * there is read from the stratigraphy as the grid reads it (domainReader: ground and unit tops interpolated between
 * the soundings, absent units pinched out), each unit with its weights above and below the water table
 * (`weights`, in the stratigraphy's unit order), and the groundwater interpolated between the soundings in the
 * same way as the contacts (linearly along chainage in 2D, over the soundings' triangles in plan in 3D); then
 * verticalStressAt (as the CPT derivation computes σv, u0 and σ′v at a reading). Returns null where no ground
 * surface or no unit is known. Not mutating.
 */
export function stressReader(
	strat: GridStratigraphy,
	weights: readonly { gammaAbove: number; gammaBelow: number }[],
	groundwater: readonly GroundwaterStation[],
	geometry: '2d' | '3d'
): (x: number, y: number, z: number) => VerticalStress | null {
	const reader = domainReader(strat, [], geometry);
	const located = groundwater.filter((s) => (geometry === '2d' ? s.chainage !== null && Number.isFinite(s.chainage) : s.x !== null && s.y !== null) && Number.isFinite(s.groundwater));
	const water =
		located.length === 0
			? () => NaN
			: geometry === '2d'
				? (x: number) => interpolateAlongChainage(located.map((s) => ({ chainage: s.chainage!, value: s.groundwater })), x)
				: triangulatedSurface(located.map((s) => ({ x: s.x!, y: s.y!, value: s.groundwater })));
	const order: number[] = [];
	return (x, y, z) => {
		const column = reader.column(x, y);
		if (!column) return null;
		const { tops, ground } = column;
		order.length = 0;
		for (let k = 0; k < tops.length; k++) if (Number.isFinite(tops[k])) order.push(k);
		if (order.length === 0) return null;
		// Highest top first, equal tops in stacking order: the later unit of equal tops is the one present.
		order.sort((a, b) => tops[b] - tops[a] || a - b);
		const units = order.filter((k, i) => i + 1 >= order.length || tops[order[i + 1]] !== tops[k]).map((k) => ({ top: tops[k], ...weights[k] }));
		const gw = water(x, y);
		return verticalStressAt({ ground, groundwater: Number.isFinite(gw) ? gw : ground, units }, z);
	};
}
