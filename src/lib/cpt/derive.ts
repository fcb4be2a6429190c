import { DEFAULT_AREA_RATIO, DEFAULT_NKT, GAMMA_W, QC1NCS_MAX, QC1NCS_MIN } from './constants';
import { correctedTip } from './correctedTip';
import { crrBI2014 } from './crrBI2014';
import { finesContentFromIc } from './finesContentFromIc';
import { CptFlag } from './flags';
import { qc1NcsBI2014 } from './qc1NcsBI2014';
import { relativeDensityIB2008 } from './relativeDensityIB2008';
import { robertson2009 } from './robertson2009';
import type { CptReadings } from './types';
import { undrainedStrength } from './undrainedStrength';

/** A stratigraphic unit as it stands at one sounding. */
export interface UnitAtSounding {
	/** Elevation of the unit's top at this sounding (m); NaN when the unit is absent here. */
	topElevation: number;
	/** Unit weight above the groundwater table (kN/m³). */
	gammaAbove: number;
	/** Unit weight below the groundwater table (kN/m³). */
	gammaBelow: number;
	/** Cone factor for su; default 14 (DEFAULT_NKT). */
	Nkt?: number;
	/** Fitting parameter of FC from Ic; default 0. */
	CFC?: number;
}

/** Options of {@link derive}. */
export interface DeriveOptions {
	/** Units ordered from the top down (non-increasing top elevations). Readings take the deepest unit whose top is at or above them. */
	units: UnitAtSounding[];
	/** Groundwater elevation (m); water above the ground surface loads it as ponded water. */
	groundwaterElevation: number;
	/** Ground elevation (m); overrides the sounding's own. */
	groundElevation?: number;
	/** Cone net area ratio; default the sounding's own, else 0.8. */
	areaRatio?: number;
	/** Measured fines content per reading (%), NaN where not measured; replaces FC from Ic where valid. */
	fc?: ArrayLike<number>;
	/** Cdq of the relative-density relation; default 0.9. */
	Cdq?: number;
	/** Unit weight of water (kN/m³); default 9.81. */
	gammaW?: number;
}

/** Derived properties per reading, all in SI (m, kPa, %, fractions). */
export interface DerivedSounding {
	/** Elevation of each reading, ground elevation − depth (m). */
	elevation: Float64Array;
	qt: Float64Array;
	sigmaV: Float64Array;
	u0: Float64Array;
	sigmaVeff: Float64Array;
	Qtn: Float64Array;
	/** Normalised friction ratio (%). */
	Fr: Float64Array;
	Ic: Float64Array;
	n: Float64Array;
	/** Fines content (%). */
	FC: Float64Array;
	CN: Float64Array;
	qc1N: Float64Array;
	qc1Ncs: Float64Array;
	/** Cyclic resistance ratio, M = 7.5, σ'v = 1 atm. */
	CRR: Float64Array;
	/** Relative density (fraction, unclamped). */
	Dr: Float64Array;
	su: Float64Array;
	/** su/σ'v. */
	suRatio: Float64Array;
	/** Index into options.units of each reading's unit. */
	unit: Int32Array;
	/** {@link CptFlag} bitmask per reading. */
	flags: Uint32Array;
}

/**
 * The derived-property pipeline of one sounding:
 * qt = qc + u2(1 − a) (Lunne et al. 1997); σv by integrating the unit weight of the unit at each depth
 * (above or below the water table) from the ground surface — the trapezoid rule with breakpoints at every
 * contact and at the water table, which is exact for piecewise-constant unit weights; u0 = γw·(depth below
 * the water table); σ'v = σv − u0; Qtn, Fr, Ic, n (Robertson 2009); FC from Ic with the unit's CFC or from a
 * measured column, qc1N, qc1Ncs from qt, CRR (Boulanger & Idriss 2014); Dr (Idriss & Boulanger 2008);
 * su with the unit's Nkt (Lunne et al. 1997) and su/σ'v.
 *
 * Out-of-range results are kept as computed and flagged (see {@link CptFlag}); only FC's own 0–100 % limits apply.
 * Does not mutate its inputs.
 *
 * @throws RangeError for unequal column lengths, depths that are not finite, non-negative and strictly
 *   increasing, a missing ground elevation, no units, misordered unit tops or non-positive unit weights or Nkt.
 */
export function derive(sounding: CptReadings, options: DeriveOptions): DerivedSounding {
	const { depth, qc, fs, u2 } = sounding;
	const N = depth.length;
	if (qc.length !== N || fs.length !== N || (u2 && u2.length !== N) || (options.fc && options.fc.length !== N)) {
		throw new RangeError('columns must have equal lengths');
	}
	for (let i = 0; i < N; i++) {
		if (!Number.isFinite(depth[i]) || depth[i] < 0 || (i > 0 && !(depth[i] > depth[i - 1]))) {
			throw new RangeError('depth must be finite, non-negative and strictly increasing');
		}
	}
	const ground = options.groundElevation ?? sounding.groundElevation;
	if (ground === undefined || !Number.isFinite(ground)) throw new RangeError('ground elevation is required');
	const gw = options.groundwaterElevation;
	if (!Number.isFinite(gw)) throw new RangeError('groundwater elevation must be finite');
	const a = options.areaRatio ?? sounding.areaRatio ?? DEFAULT_AREA_RATIO;
	if (!(a >= 0 && a <= 1)) throw new RangeError('area ratio must be within 0–1');
	const gammaW = options.gammaW ?? GAMMA_W;
	if (!(gammaW > 0)) throw new RangeError('gammaW must be positive');
	const Cdq = options.Cdq ?? 0.9;
	if (!(Cdq > 0)) throw new RangeError('Cdq must be positive');
	const units = validateUnits(options.units);

	// Present units only, top down, for the unit look-up.
	const present: number[] = [];
	for (let k = 0; k < units.length; k++) if (!Number.isNaN(units[k].topElevation)) present.push(k);
	const unitAt = (z: number): number => {
		let found = -1;
		for (const k of present) if (units[k].topElevation >= z) found = k;
		return found;
	};
	const gammaAt = (z: number): number => {
		const k = unitAt(z);
		const unit = units[k < 0 ? present[0] : k];
		return z > gw ? unit.gammaAbove : unit.gammaBelow;
	};
	const breaks = present.map((k) => units[k].topElevation).concat([gw]).sort((p, q) => q - p);

	const out = allocate(N);
	let zPrev = ground;
	let sigma = gammaW * Math.max(0, gw - ground);
	for (let i = 0; i < N; i++) {
		const z = ground - depth[i];
		out.elevation[i] = z;
		let upper = zPrev;
		for (const b of breaks) {
			if (b < upper && b > z) {
				sigma += gammaAt((upper + b) / 2) * (upper - b);
				upper = b;
			}
		}
		if (upper > z) sigma += gammaAt((upper + z) / 2) * (upper - z);
		zPrev = z;

		let flags = 0;
		const k = unitAt(z);
		if (k < 0) flags |= CptFlag.aboveFirstUnit;
		const unitIndex = k < 0 ? present[0] : k;
		const unit = units[unitIndex];
		out.unit[i] = unitIndex;

		const u0 = gammaW * Math.max(0, gw - z);
		if (z > gw) flags |= CptFlag.aboveWaterTable;
		const sigmaVeff = sigma - u0;
		out.sigmaV[i] = sigma;
		out.u0[i] = u0;
		out.sigmaVeff[i] = sigmaVeff;

		const u = u2 ? u2[i] : NaN;
		let qt: number;
		if (Number.isFinite(u)) qt = correctedTip(qc[i], u, a);
		else {
			qt = qc[i];
			flags |= CptFlag.qtFromQc;
		}
		out.qt[i] = qt;

		const r = robertson2009({ qt, fs: fs[i], sigmaV: sigma, sigmaVeff });
		flags |= r.flags;
		out.Qtn[i] = r.Qtn;
		out.Fr[i] = r.Fr;
		out.Ic[i] = r.Ic;
		out.n[i] = r.n;

		let FC = NaN;
		const measured = options.fc ? options.fc[i] : NaN;
		if (!Number.isNaN(measured)) {
			if (measured >= 0 && measured <= 100) {
				FC = measured;
				flags |= CptFlag.measuredFinesContent;
			} else flags |= CptFlag.measuredFinesContentInvalid;
		}
		if (Number.isNaN(FC)) FC = finesContentFromIc(r.Ic, unit.CFC ?? 0);
		out.FC[i] = FC;

		const c = qc1NcsBI2014({ qc: qt, sigmaVeff, FC });
		if (!c.converged && sigmaVeff > 0 && Number.isFinite(qt) && Number.isFinite(FC)) flags |= CptFlag.notConverged;
		out.CN[i] = c.CN;
		out.qc1N[i] = c.qc1N;
		out.qc1Ncs[i] = c.qc1Ncs;
		if (c.qc1Ncs < QC1NCS_MIN || c.qc1Ncs > QC1NCS_MAX) flags |= CptFlag.qc1NcsOutOfRange;
		out.CRR[i] = crrBI2014(c.qc1Ncs);
		const Dr = relativeDensityIB2008(c.qc1Ncs, Cdq);
		out.Dr[i] = Dr;
		if (Dr < 0 || Dr > 1) flags |= CptFlag.drOutOfRange;

		const su = undrainedStrength(qt, sigma, unit.Nkt ?? DEFAULT_NKT);
		out.su[i] = su;
		out.suRatio[i] = sigmaVeff > 0 ? su / sigmaVeff : NaN;
		out.flags[i] = flags;
	}
	return out;
}

function validateUnits(units: UnitAtSounding[]): UnitAtSounding[] {
	if (!Array.isArray(units) || units.length === 0) throw new RangeError('at least one unit is required');
	let lastTop = Infinity;
	let anyPresent = false;
	for (const u of units) {
		if (!(u.gammaAbove > 0) || !(u.gammaBelow > 0) || !Number.isFinite(u.gammaAbove) || !Number.isFinite(u.gammaBelow)) {
			throw new RangeError('unit weights must be positive');
		}
		if (u.Nkt !== undefined && !(u.Nkt > 0)) throw new RangeError('Nkt must be positive');
		if (u.CFC !== undefined && !Number.isFinite(u.CFC)) throw new RangeError('CFC must be finite');
		if (Number.isNaN(u.topElevation)) continue;
		if (!(u.topElevation <= lastTop)) throw new RangeError('units must be ordered top down');
		lastTop = u.topElevation;
		anyPresent = true;
	}
	if (!anyPresent) throw new RangeError('at least one unit must be present');
	return units;
}

function allocate(N: number): DerivedSounding {
	const f = (): Float64Array => new Float64Array(N);
	return {
		elevation: f(), qt: f(), sigmaV: f(), u0: f(), sigmaVeff: f(), Qtn: f(), Fr: f(), Ic: f(), n: f(), FC: f(),
		CN: f(), qc1N: f(), qc1Ncs: f(), CRR: f(), Dr: f(), su: f(), suRatio: f(),
		unit: new Int32Array(N), flags: new Uint32Array(N)
	};
}
