/**
 * Undrained shear strength from the net cone resistance, su = (qt − σv)/Nkt (Lunne, Robertson & Powell 1997,
 * *Cone Penetration Testing in Geotechnical Practice*; Nkt typically 10–20, calibrated per site).
 * A negative net resistance gives a negative su, which callers flag rather than clamp.
 *
 * @param qt corrected cone resistance (kPa)
 * @param sigmaV total vertical stress (kPa)
 * @param Nkt cone factor (> 0)
 * @returns su (kPa)
 * @throws RangeError when Nkt is not positive.
 */
export function undrainedStrength(qt: number, sigmaV: number, Nkt: number): number {
	if (!(Nkt > 0)) throw new RangeError('Nkt must be positive');
	return (qt - sigmaV) / Nkt;
}
