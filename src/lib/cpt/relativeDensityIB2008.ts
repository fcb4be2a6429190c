import pow from '@stdlib/math-base-special-pow';

/**
 * Relative density from the clean-sand equivalent resistance, Dr = 0.465·(qc1Ncs/Cdq)^0.264 − 1.063
 * (Idriss & Boulanger 2008, *Soil Liquefaction During Earthquakes*, EERI MNO-12), as a fraction.
 * Deliberately not clamped to 0–1; callers flag values outside (CptFlag.drOutOfRange).
 *
 * @param qc1Ncs clean-sand equivalent normalised cone resistance; negative or NaN gives NaN
 * @param Cdq fitting constant; default 0.9
 * @throws RangeError when Cdq is not positive.
 */
export function relativeDensityIB2008(qc1Ncs: number, Cdq = 0.9): number {
	if (!(Cdq > 0)) throw new RangeError('Cdq must be positive');
	if (!(qc1Ncs >= 0)) return NaN;
	return 0.465 * pow(qc1Ncs / Cdq, 0.264) - 1.063;
}
