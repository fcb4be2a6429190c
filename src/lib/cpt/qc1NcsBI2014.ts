import pow from '@stdlib/math-base-special-pow';
import exp from '@stdlib/math-base-special-exp';
import { CN_MAX, PA_KPA, QC1NCS_MAX, QC1NCS_MIN } from './constants';

/** Inputs of {@link qc1NcsBI2014}: qc and σ'v in kPa, FC in %. */
export interface Qc1NcsInput {
	qc: number;
	sigmaVeff: number;
	FC: number;
}

/** Result of {@link qc1NcsBI2014}. */
export interface Qc1NcsResult {
	/** Overburden correction factor CN = (pa/σ'v)^m ≤ 1.7. */
	CN: number;
	/** Stress exponent m = 1.338 − 0.249·qc1Ncs^0.264, qc1Ncs limited to 21–254 inside it. */
	m: number;
	/** Overburden-corrected normalised resistance qc1N = CN·qc/pa. */
	qc1N: number;
	/** Clean-sand equivalent qc1Ncs = qc1N + Δqc1N. */
	qc1Ncs: number;
	/** True when the iteration ran and converged; false for NaN or out-of-domain input too. */
	converged: boolean;
}

/** Iteration controls of {@link qc1NcsBI2014}. */
export interface Qc1NcsOptions {
	/** Stop when successive qc1Ncs differ by less than this; default 1e-9. */
	tolerance?: number;
	/** Give up after this many updates; default 100. */
	maxIterations?: number;
}

/**
 * Overburden-corrected, clean-sand equivalent cone resistance of Boulanger & Idriss (2014), report
 * UCD/CGM-14/01, with CN iterated through its dependence on qc1Ncs:
 *
 *   m = 1.338 − 0.249·min(254, max(21, qc1Ncs))^0.264,  CN = min(1.7, (pa/σ'v)^m),  qc1N = CN·qc/pa,
 *   Δqc1N = (11.9 + qc1N/14.6)·exp(1.63 − 9.7/(FC + 2) − (15.7/(FC + 2))²),  qc1Ncs = qc1N + Δqc1N.
 *
 * The derive pipeline passes the corrected resistance qt as qc where u2 is measured — our choice: the two
 * differ by a few per cent in sands, and qt removes the pore-pressure effect on the tip in silts.
 * σ'v ≤ 0 or NaN input gives NaN values with converged = false.
 *
 * @throws RangeError when FC is outside 0–100 %.
 */
export function qc1NcsBI2014(p: Qc1NcsInput, options: Qc1NcsOptions = {}): Qc1NcsResult {
	const { tolerance = 1e-9, maxIterations = 100 } = options;
	const { qc, sigmaVeff, FC } = p;
	if (FC < 0 || FC > 100) throw new RangeError('FC must be within 0–100 %');
	if (!(sigmaVeff > 0) || Number.isNaN(qc) || Number.isNaN(FC)) {
		return { CN: NaN, m: NaN, qc1N: NaN, qc1Ncs: NaN, converged: false };
	}
	const qcN = qc / PA_KPA;
	const stressRatio = PA_KPA / sigmaVeff;
	const f = 15.7 / (FC + 2);
	const fcFactor = exp(1.63 - 9.7 / (FC + 2) - f * f);

	// Start from the m of a medium sand; the update contracts quickly because m varies slowly with qc1Ncs.
	let qc1Ncs = 100;
	let m = NaN;
	let CN = NaN;
	let qc1N = NaN;
	let converged = false;
	for (let k = 0; k < maxIterations; k++) {
		m = 1.338 - 0.249 * pow(Math.min(QC1NCS_MAX, Math.max(QC1NCS_MIN, qc1Ncs)), 0.264);
		CN = Math.min(CN_MAX, pow(stressRatio, m));
		qc1N = CN * qcN;
		const next = qc1N + (11.9 + qc1N / 14.6) * fcFactor;
		const step = Math.abs(next - qc1Ncs);
		qc1Ncs = next;
		if (step < tolerance) {
			converged = true;
			break;
		}
	}
	return { CN, m, qc1N, qc1Ncs, converged };
}
