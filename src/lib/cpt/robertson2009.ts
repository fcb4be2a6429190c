import pow from '@stdlib/math-base-special-pow';
import log10 from '@stdlib/math-base-special-log10';
import { IC_CHART_MAX, IC_CHART_MIN, PA_KPA } from './constants';
import { CptFlag } from './flags';

/** Inputs of {@link robertson2009}, all in kPa. */
export interface Robertson2009Input {
	qt: number;
	fs: number;
	sigmaV: number;
	sigmaVeff: number;
}

/** Result of {@link robertson2009}. Values that cannot be computed are NaN, with the reason in `flags`. */
export interface Robertson2009Result {
	/** Normalised cone resistance Qtn = ((qt − σv)/pa)·(pa/σ'v)^n. */
	Qtn: number;
	/** Normalised friction ratio Fr = fs/(qt − σv)·100, in %. */
	Fr: number;
	/** Soil behaviour type index Ic. */
	Ic: number;
	/** Stress exponent n at convergence. */
	n: number;
	/** True when the iteration for n ran and converged. */
	converged: boolean;
	/** {@link CptFlag} bits: negativeNetResistance, nonPositiveFriction, nonPositiveStress, icOutOfChart, notConverged, missingReading. */
	flags: number;
}

/** Iteration controls of {@link robertson2009}. */
export interface Robertson2009Options {
	/** Stop when successive n differ by less than this; default 1e-9. */
	tolerance?: number;
	/** Give up (and flag notConverged) after this many updates of n; default 100. */
	maxIterations?: number;
}

/**
 * Normalised cone resistance Qtn, friction ratio Fr and soil behaviour type index Ic with the stress exponent
 * n iterated to convergence (Robertson 2009, *Canadian Geotechnical Journal* 46(11)):
 *
 *   Qtn = ((qt − σv)/pa)·(pa/σ'v)^n,  Fr = fs/(qt − σv)·100 %,
 *   Ic = √((3.47 − log Qtn)² + (log Fr + 1.22)²),  n = 0.381·Ic + 0.05·(σ'v/pa) − 0.15 ≤ 1.
 *
 * The iteration starts from n = 1 and is a plain fixed-point update; it converges except at effective
 * stresses of a fraction of a kPa, where the result is flagged notConverged. Inputs outside the method's
 * domain (qt − σv ≤ 0, fs ≤ 0, σ'v ≤ 0, NaN) give NaN with a flag rather than an exception, because a
 * sounding routinely holds a few such readings.
 *
 * @param p qt, fs, σv, σ'v in kPa.
 */
export function robertson2009(p: Robertson2009Input, options: Robertson2009Options = {}): Robertson2009Result {
	const { tolerance = 1e-9, maxIterations = 100 } = options;
	const { qt, fs, sigmaV, sigmaVeff } = p;
	const net = qt - sigmaV;
	let flags = 0;
	if (Number.isNaN(qt) || Number.isNaN(fs) || Number.isNaN(sigmaV) || Number.isNaN(sigmaVeff)) flags |= CptFlag.missingReading;
	if (net <= 0) flags |= CptFlag.negativeNetResistance;
	if (fs <= 0) flags |= CptFlag.nonPositiveFriction;
	if (sigmaVeff <= 0) flags |= CptFlag.nonPositiveStress;
	const Fr = net > 0 ? (fs / net) * 100 : NaN;
	if (flags !== 0) return { Qtn: NaN, Fr, Ic: NaN, n: NaN, converged: false, flags };

	const logQnet = log10(net / PA_KPA);
	const logStress = log10(PA_KPA / sigmaVeff);
	const frTerm = log10(Fr) + 1.22;
	const stressTerm = 0.05 * (sigmaVeff / PA_KPA) - 0.15;
	const icOf = (n: number): number => {
		const q = 3.47 - (logQnet + n * logStress);
		return Math.sqrt(q * q + frTerm * frTerm);
	};

	let n = 1;
	let converged = false;
	for (let k = 0; k < maxIterations; k++) {
		const next = Math.min(1, 0.381 * icOf(n) + stressTerm);
		const step = Math.abs(next - n);
		n = next;
		if (step < tolerance) {
			converged = true;
			break;
		}
	}
	const Qtn = (net / PA_KPA) * pow(PA_KPA / sigmaVeff, n);
	const Ic = icOf(n);
	if (!converged) flags |= CptFlag.notConverged;
	if (!(Ic >= IC_CHART_MIN && Ic <= IC_CHART_MAX)) flags |= CptFlag.icOutOfChart;
	return { Qtn, Fr, Ic, n, converged, flags };
}
