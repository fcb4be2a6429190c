import exp from '@stdlib/math-base-special-exp';

/**
 * Cyclic resistance ratio for M = 7.5 and σ'v = 1 atm from the clean-sand equivalent resistance
 * (Boulanger & Idriss 2014, report UCD/CGM-14/01):
 *
 *   CRR = exp(qc1Ncs/113 + (qc1Ncs/1000)² − (qc1Ncs/140)³ + (qc1Ncs/137)⁴ − 2.80).
 *
 * Not limited: the relation is meant for qc1Ncs up to about 211–254, and callers flag values beyond
 * (see CptFlag.qc1NcsOutOfRange). NaN gives NaN.
 */
export function crrBI2014(qc1Ncs: number): number {
	const a = qc1Ncs / 1000;
	const b = qc1Ncs / 140;
	const c = qc1Ncs / 137;
	return exp(qc1Ncs / 113 + a * a - b * b * b + c * c * c * c - 2.8);
}
