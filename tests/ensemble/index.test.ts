import { describe, it, expect } from 'vitest';
import * as ensemble from '../../src/lib/ensemble/index';

describe('src/lib/ensemble/index.ts', () => {
	it('index.ts exports exactly the pinned names', () => {
		expect(Object.keys(ensemble).sort()).toEqual(['ENSEMBLE_STATS', 'checkRealizations', 'checkUniform', 'ensembleMap', 'gridVariogram', 'ksDistance', 'labelWeakZones', 'largestExtentQuantiles', 'weakZoneFigures', 'weakZones']);
		expect(ensemble.ENSEMBLE_STATS).toEqual(['mean', 'sd', 'p10', 'p50', 'p90', 'below']);
	});
});
