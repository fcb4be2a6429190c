/**
 * Fines content from the soil behaviour type index, FC = 80·(Ic + CFC) − 137, limited to 0–100 % as the
 * method defines (Boulanger & Idriss 2014, report UCD/CGM-14/01). CFC is a site-specific fitting parameter,
 * 0 for the generic relation.
 *
 * @param Ic soil behaviour type index (Robertson 2009); NaN gives NaN
 * @param CFC fitting parameter; default 0
 * @returns FC in %
 */
export function finesContentFromIc(Ic: number, CFC = 0): number {
	const fc = 80 * (Ic + CFC) - 137;
	if (Number.isNaN(fc)) return NaN;
	return Math.min(100, Math.max(0, fc));
}
