import { GAMMA_W } from './constants';

/** A soil column at one plan position, as the stratigraphy gives it. */
export interface StressColumn {
	/** Ground elevation (m). */
	ground: number;
	/** Groundwater elevation (m); water above the ground surface loads it as ponded water. */
	groundwater: number;
	/**
	 * The units present here, top down (non-increasing tops), each with its top elevation and unit weights
	 * above and below the water table (kN/m³). A point takes the deepest unit whose top is at or above it; above
	 * the first top, the first unit's weights apply (as in derive).
	 */
	units: readonly { top: number; gammaAbove: number; gammaBelow: number }[];
	/** Unit weight of water (kN/m³); default 9.81. */
	gammaW?: number;
}

/** Total and effective vertical stress and hydrostatic pore pressure at an elevation (kPa). */
export interface VerticalStress {
	sigmaV: number;
	u0: number;
	sigmaVeff: number;
}

/**
 * The vertical stresses at elevation z of a soil column, as the CPT derivation computes them at a reading
 * (derive): σv = γw·max(0, gw − ground) + ∫ γ dz from the ground down to z, with γ the unit weight of the unit
 * at each depth (above or below the water table), integrated piece by piece between the contacts and the water
 * table (exact for piecewise-constant weights); u0 = γw·max(0, gw − z); σ′v = σv − u0 (Terzaghi's effective
 * stress; e.g. Lunne, Robertson & Powell 1997, ch. 5). A point above the ground has σv = the ponded water's
 * weight (0 without water) and no effective stress beyond it. Not mutating.
 * @throws {RangeError} for a non-finite ground, groundwater or z, no units, tops that rise downwards or
 *   non-positive unit weights
 */
export function verticalStressAt(column: StressColumn, z: number): VerticalStress {
	const { ground, groundwater: gw, units } = column;
	const gammaW = column.gammaW ?? GAMMA_W;
	if (!Number.isFinite(ground) || !Number.isFinite(gw) || !Number.isFinite(z)) throw new RangeError('ground, groundwater and z must be finite');
	if (units.length === 0) throw new RangeError('a column needs at least one unit');
	for (let k = 0; k < units.length; k++) {
		const u = units[k];
		if (!(u.gammaAbove > 0) || !(u.gammaBelow > 0)) throw new RangeError('unit weights must be positive');
		if (k > 0 && !(u.top <= units[k - 1].top)) throw new RangeError('unit tops must not rise downwards');
	}
	const gammaAt = (e: number): number => {
		let unit = units[0];
		for (const u of units) if (u.top >= e) unit = u;
		return e > gw ? unit.gammaAbove : unit.gammaBelow;
	};
	let sigmaV = gammaW * Math.max(0, gw - ground);
	if (z < ground) {
		const breaks = units.map((u) => u.top).concat([gw]).filter((b) => b < ground && b > z).sort((p, q) => q - p);
		let upper = ground;
		for (const b of breaks) {
			if (b >= upper) continue;
			sigmaV += gammaAt((upper + b) / 2) * (upper - b);
			upper = b;
		}
		sigmaV += gammaAt((upper + z) / 2) * (upper - z);
	}
	const u0 = gammaW * Math.max(0, gw - z);
	return { sigmaV, u0, sigmaVeff: sigmaV - u0 };
}
