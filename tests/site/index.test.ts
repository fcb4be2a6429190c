import { describe, expect, it } from 'vitest';
import * as site from '../../src/lib/site/index';

// The site model's runtime exports, pinned: adding or removing one means editing this list.
const EXPORTS = [
	'DEFAULT_RULES',
	'RULE_ORDER',
	'WHOLE_UNIT',
	'averageInWindows',
	'axisCount',
	'cellsPerDomain',
	'domainRuns',
	'gridDefinition',
	'gridDomains',
	'cellElevation',
	'axesDomains',
	'pointDomains',
	'domainReader',
	'elevationCells',
	'unitHeightBands',
	'stressReader',
	'gridStratigraphy',
	'boundaryChainageAt',
	'boundarySides',
	'checkPolyline',
	'contactLines',
	'declusterWeights',
	'domainDefaults',
	'effectiveTops',
	'domainStatistics',
	'emptyRuleCounts',
	'extractDomainSamples',
	'interpolateAlongChainage',
	'interpolateContacts',
	'locateSounding',
	'membersOverlap',
	'planDistance',
	'polylineLength',
	'projectOntoPolyline',
	'readingRule',
	'triangulatedSurface',
	'weightedCdf',
	'zoneNamesOf',
	'zoneOf'
];

describe('src/lib/site/index.ts', () => {
	it('exports exactly the pinned names', () => {
		expect(Object.keys(site).sort()).toEqual([...EXPORTS].sort());
	});
});
