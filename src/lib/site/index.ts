// The site model's pure geometry and statistics: sections, contacts, zones and domain samples, without a
// database. Every export is named here; tests/site/index.test.ts pins the list.

// Section geometry: chainage and where a sounding lies.
export { projectOntoPolyline, polylineLength, checkPolyline, planDistance } from './project-onto-polyline';
export type { Polyline, Projection } from './project-onto-polyline';
export { locateSounding } from './locate-sounding';
export type { SoundingLocation } from './locate-sounding';

// Contacts: along the section, over a triangulation of the soundings in plan, the top unit's default, and
// contacts for a sounding without its own.
export { interpolateAlongChainage } from './interpolate-along-chainage';
export type { Station } from './interpolate-along-chainage';
export { contactLines } from './contact-lines';
export { effectiveTops } from './effective-tops';
export type { ContactSource, StoredTop } from './effective-tops';
export { interpolateContacts } from './interpolate-contacts';
export type { ContactStation, ContactTarget } from './interpolate-contacts';
export { triangulatedSurface } from './triangulated-surface';
export type { PlanPoint } from './triangulated-surface';

// Zones and domain members.
export { zoneOf, boundaryChainageAt } from './zone-of';
export type { BoundaryLine } from './zone-of';
export { boundarySides } from './boundary-sides';
export { zoneNamesOf } from './zone-names';
export { membersOverlap, WHOLE_UNIT } from './members-overlap';
export type { Member } from './members-overlap';
export { domainDefaults } from './domain-defaults';
export type { DomainDefaults } from './domain-defaults';

// Domain samples and their distribution.
export { extractDomainSamples } from './extract-domain-samples';
export type { ExtractSounding, ExtractOptions, ExtractResult, LeftOutSounding } from './extract-domain-samples';
export { readingRule, emptyRuleCounts, DEFAULT_RULES, RULE_ORDER } from './conditioning-rules';
export type { ConditioningRules, RuleCounts, RuleKey, RuleReading } from './conditioning-rules';
export { averageInWindows } from './average-in-windows';
export { declusterWeights } from './decluster-weights';
export type { DeclusterCell } from './decluster-weights';
export { weightedCdf } from './weighted-cdf';
export type { Cdf } from './weighted-cdf';
export { domainStatistics } from './domain-statistics';
export type { DomainStats } from './domain-statistics';

// Target grids: the domain of each cell, read from the stratigraphy and a zonation.
export { gridDomains, cellElevation, axesDomains, pointDomains, domainReader, gridDefinition, axisCount, domainRuns, cellsPerDomain } from './grid-domains';
export type { GridAxis, GridSpec, GridDefinition, GridStratigraphy, StratigraphyStation, StratigraphyColumn } from './grid-domains';
export { elevationCells, unitHeightBands } from './elevation-cells';
export { stressReader } from './element-stress';
export type { GroundwaterStation } from './element-stress';
export type { ElevationCells, HeightBand } from './elevation-cells';
export { gridStratigraphy } from './grid-stratigraphy';
export type { StratigraphyParts } from './grid-stratigraphy';
