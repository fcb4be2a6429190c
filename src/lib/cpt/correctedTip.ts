/**
 * Corrected cone resistance qt = qc + u2·(1 − a), which removes the effect of pore pressure acting on the
 * unequal end areas behind the cone tip (Lunne, Robertson & Powell 1997, *Cone Penetration Testing in
 * Geotechnical Practice*).
 *
 * @param qc cone resistance (kPa)
 * @param u2 pore pressure measured just behind the cone (kPa); NaN gives NaN
 * @param a cone net area ratio, 0 ≤ a ≤ 1 (typically 0.7–0.85)
 * @returns qt (kPa)
 * @throws RangeError when a is outside 0–1.
 */
export function correctedTip(qc: number, u2: number, a: number): number {
	if (!(a >= 0 && a <= 1)) throw new RangeError('area ratio must be within 0–1');
	return qc + u2 * (1 - a);
}
