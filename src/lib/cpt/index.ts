// The CPT library: published correlations and file parsers, pure functions in SI (m, kPa).

export {
	CN_MAX,
	DEFAULT_AREA_RATIO,
	DEFAULT_NKT,
	FT_TO_M,
	GAMMA_W,
	IC_CHART_MAX,
	IC_CHART_MIN,
	MAX_FILE_BYTES,
	PA_KPA,
	QC1NCS_MAX,
	QC1NCS_MIN,
	TSF_TO_KPA
} from './constants';
export { lengthUnitFactor, stressUnitFactor } from './units';
export { CptFlag, describeFlags } from './flags';
export type { CptFlagName } from './flags';
export { CptParseError, assertFileSize } from './errors';
export type { CptParseErrorCode, CptParseErrorInit } from './errors';
export type { CptReadings, ParseOptions, ParsedSounding } from './types';

export { correctedTip } from './correctedTip';
export { robertson2009 } from './robertson2009';
export type { Robertson2009Input, Robertson2009Options, Robertson2009Result } from './robertson2009';
export { finesContentFromIc } from './finesContentFromIc';
export { qc1NcsBI2014 } from './qc1NcsBI2014';
export type { Qc1NcsInput, Qc1NcsOptions, Qc1NcsResult } from './qc1NcsBI2014';
export { crrBI2014 } from './crrBI2014';
export { relativeDensityIB2008 } from './relativeDensityIB2008';
export { undrainedStrength } from './undrainedStrength';
export { verticalStressAt } from './verticalStressAt';
export type { StressColumn, VerticalStress } from './verticalStressAt';
export { lookUp, lookupTableProblem } from './lookupTable';
export type { LookupTable, LookedUp, Monotonic } from './lookupTable';
export { derive } from './derive';
export type { DeriveOptions, DerivedSounding, UnitAtSounding } from './derive';

export { decodeCptText } from './decodeCptText';
export { detectFormat } from './detectFormat';
export type { CptFileFormat } from './detectFormat';
export { GEF_MEASUREMENTVAR_AREA_RATIO, GEF_QUANTITY, parseGef } from './parseGef';
export { formatGef } from './formatGef';
export type { FormatGefOptions } from './formatGef';
export { parseAgs4 } from './parseAgs4';
export { parseAgs4Geology } from './parseAgs4Geology';
export type { Ags4GeologyLayer } from './parseAgs4Geology';
export { formatAgs4 } from './formatAgs4';
export type { FormatAgs4Options } from './formatAgs4';
export { parseDelimited } from './parseDelimited';
export type { ColumnOrValue, DelimitedLengthUnit, DelimitedMapping, DelimitedStressUnit } from './parseDelimited';
export type { Delimiter } from './delimitedText';
export { previewDelimited } from './previewDelimited';
export type { DelimitedMappingGuess, DelimitedPreview, PreviewOptions } from './previewDelimited';
export { formatDelimited } from './formatDelimited';
export type { FormatDelimitedOptions } from './formatDelimited';
