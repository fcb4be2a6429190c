import { describe, expect, it } from 'vitest';
import * as cpt from '$lib/cpt';

describe('src/lib/cpt/index.ts', () => {
	it('exports exactly the documented runtime names', () => {
		expect(Object.keys(cpt).sort()).toEqual(
			[
				'CN_MAX',
				'CptFlag',
				'CptParseError',
				'DEFAULT_AREA_RATIO',
				'DEFAULT_NKT',
				'FT_TO_M',
				'GAMMA_W',
				'GEF_MEASUREMENTVAR_AREA_RATIO',
				'GEF_QUANTITY',
				'IC_CHART_MAX',
				'IC_CHART_MIN',
				'MAX_FILE_BYTES',
				'PA_KPA',
				'QC1NCS_MAX',
				'QC1NCS_MIN',
				'TSF_TO_KPA',
				'assertFileSize',
				'correctedTip',
				'crrBI2014',
				'decodeCptText',
				'derive',
				'describeFlags',
				'detectFormat',
				'finesContentFromIc',
				'formatAgs4',
				'formatDelimited',
				'formatGef',
				'lengthUnitFactor',
				'lookUp',
				'lookupTableProblem',
				'parseAgs4',
				'parseAgs4Geology',
				'parseDelimited',
				'parseGef',
				'previewDelimited',
				'qc1NcsBI2014',
				'relativeDensityIB2008',
				'robertson2009',
				'stressUnitFactor',
				'undrainedStrength',
				'verticalStressAt'
			].sort()
		);
	});
});
