// The site barrel's grid functions and the engine's target expansion, for the grid tests.
export { axisCount, cellsPerDomain, domainRuns, gridDefinition, gridDomains, gridStratigraphy } from '../../src/lib/site/index';
export type { GridSpec, GridStratigraphy, GridDefinition } from '../../src/lib/site/index';
import { targetsFromDefinition } from '../../src/lib/geostat/index';
import { domainRuns } from '../../src/lib/site/index';
import type { GridDefinition } from '../../src/lib/site/index';

/** The engine's targets of a grid with these cell domains. */
export function targetsOf(grid: GridDefinition, domain: Int32Array) {
	return targetsFromDefinition({ kind: 'grid', ...grid, domainRuns: domainRuns(domain) });
}
