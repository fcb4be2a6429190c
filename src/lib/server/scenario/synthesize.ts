/**
 * Turns the demo scenario's target properties into CPT readings (qc, fs, u2), by inverting the same
 * published correlations that the derived-property pipeline applies forward: Robertson (2009) for Ic and
 * Boulanger & Idriss (2014) for qc1Ncs. Deriving properties from the synthetic readings therefore gives
 * back the targets, up to the measurement noise added here. Demo data only.
 */
import { finesContentFromIc, qc1NcsBI2014 } from '../../cpt/index';
import {
	AREA_RATIO,
	CHANNEL_AXIS,
	CRUST_STRENGTH,
	crustThickness,
	FIRST_DEPTH,
	GROUNDWATER_ELEVATION,
	LEVEE_UNITS,
	READING_INTERVAL,
	unitAt,
	type LeveeUnitKey,
	type ScenarioSounding
} from './levee';

const PA = 101.325;
const GAMMA_W = 9.81;

/** Domains of the true field: the sand is looser west of the channel than east of it. */
export const TRUTH_DOMAINS = ['overbank', 'pointbar-west', 'pointbar-east', 'plug', 'dense'] as const;
export type TruthDomain = (typeof TRUTH_DOMAINS)[number];

/**
 * Per truth domain: median and log-standard deviation of the simulated property, and the Ic mean. The clays
 * are soft and normally consolidated: su/σ′v about 0.2–0.35 (common practice); the overbank clay also has a
 * desiccated crust on top (crustStrength).
 */
const TARGETS: Record<TruthDomain, { median: number; logSd: number; icMean: number; icSlope: number; bq: number }> = {
	overbank: { median: 0.27, logSd: 0.15, icMean: 2.95, icSlope: 0.12, bq: 0.15 },
	'pointbar-west': { median: 80, logSd: 0.22, icMean: 2.0, icSlope: 0.15, bq: 0 },
	'pointbar-east': { median: 125, logSd: 0.2, icMean: 1.85, icSlope: 0.12, bq: 0 },
	plug: { median: 0.26, logSd: 0.2, icMean: 3.25, icSlope: 0.1, bq: 0.45 },
	dense: { median: 175, logSd: 0.18, icMean: 1.7, icSlope: 0.1, bq: 0 }
};

export function truthDomainAt(c: number, z: number): TruthDomain {
	const unit = unitAt(c, z);
	if (unit === 'pointbar') return c < CHANNEL_AXIS ? 'pointbar-west' : 'pointbar-east';
	return unit;
}

/** Depths of a sounding's readings, from FIRST_DEPTH to the scenario's bottom elevation. */
export function readingDepths(s: ScenarioSounding, bottomElevation: number): Float64Array {
	const n = Math.floor((s.groundElevation - bottomElevation - FIRST_DEPTH) / READING_INTERVAL + 1e-9) + 1;
	const depth = new Float64Array(n);
	for (let i = 0; i < n; i++) depth[i] = Math.round((FIRST_DEPTH + i * READING_INTERVAL) * 1000) / 1000;
	return depth;
}

export interface SynthesisInput {
	sounding: ScenarioSounding;
	depth: Float64Array;
	/** Standard Gaussian value of the true field at each reading. */
	field: Float64Array;
	/** Independent standard Gaussian values at each reading, for measurement noise. */
	noise: Float64Array;
	/** Relative standard deviation of the multiplicative noise on qc and fs (default 0.02). */
	noiseLevel?: number;
}

export interface SynthesizedSounding {
	qc: Float64Array;
	fs: Float64Array;
	u2: Float64Array;
	/** The targets, for checks: simulated property (qc1Ncs or su/σ'v), Ic, and the truth domain. */
	target: Float64Array;
	ic: Float64Array;
	domain: TruthDomain[];
}

/** CPT readings (kPa) of one sounding for a given true field. */
export function synthesizeSounding({ sounding, depth, field, noise, noiseLevel = 0.02 }: SynthesisInput): SynthesizedSounding {
	const n = depth.length;
	const out: SynthesizedSounding = {
		qc: new Float64Array(n),
		fs: new Float64Array(n),
		u2: new Float64Array(n),
		target: new Float64Array(n),
		ic: new Float64Array(n),
		domain: []
	};
	const c = sounding.chainage;
	let sigmaV = 0;
	let previous = 0;
	for (let i = 0; i < n; i++) {
		const d = depth[i];
		const z = sounding.groundElevation - d;
		const mid = sounding.groundElevation - (previous + d) / 2;
		sigmaV += unitWeight(unitAt(c, mid), mid) * (d - previous);
		previous = d;
		const u0 = GAMMA_W * Math.max(0, GROUNDWATER_ELEVATION - z);
		const sigmaVeff = sigmaV - u0;
		const domain = truthDomainAt(c, z);
		const t = TARGETS[domain];
		const y = field[i];
		// In the crust the strength of the normally consolidated clay gains an overconsolidated excess that fades
		// with depth; near the surface σ′v tends to zero, so su/σ′v there reads far higher (common practice).
		const crust = domain === 'overbank' ? crustStrength(d, crustThickness(c), y) : 0;
		const target = t.median * Math.exp(t.logSd * y) + (crust > 0 ? crust / sigmaVeff : 0);
		const ic = t.icMean - t.icSlope * y;
		const clay = domain === 'overbank' || domain === 'plug';
		let qt: number;
		let u2: number;
		if (clay) {
			qt = 14 * target * sigmaVeff + sigmaV;
			u2 = z > GROUNDWATER_ELEVATION ? 0 : u0 + t.bq * (qt - sigmaV);
		} else {
			u2 = u0;
			qt = qcForQc1Ncs(target, sigmaVeff, finesContentFromIc(ic)) + u2 * (1 - AREA_RATIO);
		}
		const fs = sleeveFrictionForIc(ic, qt, sigmaV, sigmaVeff);
		const jitter = 1 + noiseLevel * noise[i];
		out.qc[i] = Math.max(1, (qt - u2 * (1 - AREA_RATIO)) * jitter);
		out.fs[i] = Math.max(0.1, fs * jitter);
		out.u2[i] = u2;
		out.target[i] = target;
		out.ic[i] = ic;
		out.domain.push(domain);
	}
	return out;
}

/**
 * The undrained strength the desiccated crust adds at depth d (kPa): CRUST_STRENGTH·(1 − d/thickness)² above the
 * crust's base, scaled by the field's own variation (log-sd 0.2), nothing below.
 */
export function crustStrength(d: number, thickness: number, y: number): number {
	if (d >= thickness) return 0;
	const f = 1 - d / thickness;
	return CRUST_STRENGTH * f * f * Math.exp(0.2 * y);
}

function unitWeight(unit: LeveeUnitKey, z: number): number {
	const u = LEVEE_UNITS.find((v) => v.key === unit)!;
	return z > GROUNDWATER_ELEVATION ? u.gammaAbove : u.gammaBelow;
}

/** qc (kPa) whose Boulanger & Idriss (2014) qc1Ncs equals the target; bisection, as qc1Ncs rises with qc. */
function qcForQc1Ncs(target: number, sigmaVeff: number, FC: number): number {
	let lo = 5;
	let hi = 200_000;
	for (let k = 0; k < 80; k++) {
		const mid = (lo + hi) / 2;
		if (qc1NcsBI2014({ qc: mid, sigmaVeff, FC }).qc1Ncs < target) lo = mid;
		else hi = mid;
	}
	return (lo + hi) / 2;
}

/**
 * fs (kPa) for which Robertson's (2009) Ic equals the target, given qt and stresses: with the stress
 * exponent n fixed by the target Ic, Qtn is known and Ic² = (3.47 − log Qtn)² + (log Fr + 1.22)² gives Fr.
 * Where no Fr reaches the target (very high Qtn), the smallest friction ratio on the chart is used.
 */
function sleeveFrictionForIc(ic: number, qt: number, sigmaV: number, sigmaVeff: number): number {
	const n = Math.min(1, 0.381 * ic + (0.05 * sigmaVeff) / PA - 0.15);
	const net = qt - sigmaV;
	const Qtn = (net / PA) * (PA / sigmaVeff) ** n;
	const a = 3.47 - Math.log10(Qtn);
	const b = ic * ic - a * a;
	const logFr = b > 0 ? Math.sqrt(b) - 1.22 : -1.22;
	return (10 ** logFr / 100) * net;
}
