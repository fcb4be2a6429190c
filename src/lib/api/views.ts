/**
 * What the API returns, as the services define it: type-only re-exports, so client code never copies a view
 * and never pulls server code into the browser (these imports are erased at build time).
 */
export type { ProjectView } from '$lib/server/services/projects';
export type { SiteView } from '$lib/server/services/site';
export type { UnitView, ContactView, ZoneBoundaryView, SectionView, SectionContact } from '$lib/server/services/stratigraphy';
export type { ZonationView, DomainView, MemberView as DomainMemberView } from '$lib/server/services/zonations';
export type { DomainSamples } from '$lib/server/services/domains';
export type { DomainStats, Cdf } from '$lib/site';
export type { SoundingSummary, SoundingDetailView, JsonColumn } from '$lib/server/services/soundings';
export type { UnitAtSoundingView } from '$lib/server/services/derived';
export type { ImportResult, FileProblem } from '$lib/server/services/import';
export type { VariogramView, CommentView, PersonView } from '$lib/server/services/variograms';
export type { RecipeSummaryView, RecipeView, RecipeProvenance, ProvenanceDomain, ApprovalView, RecipeNoteView, Notified } from '$lib/server/services/recipes';
export type { AuditEntryView } from '$lib/server/services/audit';
export type { MeshView } from '$lib/server/services/meshes';
export type { MeshPreview } from '$lib/mesh';
export type { TransferTableView, TransferSetView, ResolvedTransferSet } from '$lib/server/services/transfers';
export type { ExportJobView } from '$lib/server/services/export-jobs';

/** GET …/recipes/:rid/realizations/:r as JSON: null where a target is not simulated. */
export interface RealizationJson {
	hash: string;
	engineVersion: string;
	realization: number;
	values: (number | null)[];
}

/** GET …/recipes/:rid/summary: an ensemble map, null where a target is not simulated. */
export interface SummaryJson {
	hash: string;
	stat: import('$lib/ensemble').EnsembleStat;
	threshold: number | null;
	realizations: number;
	values: (number | null)[];
}

/** GET …/recipes/:rid/weak-zones: weak-zone continuity over the N realizations (the contract's shape). */
export interface WeakZonesJson {
	property: import('$lib/properties').SimulatedProperty;
	threshold: number;
	minLength: number;
	domains: number[];
	realizations: { realization: number; zones: number; largestExtent: number; largestArea: number; crossesBoundary: boolean | null }[];
	crossingProbability: number | null;
	probabilityMap: (number | null)[];
}

/** GET …/audit: a page of the log, the id to page back from (null at the end), and the people in it. */
export interface AuditPage {
	entries: import('$lib/server/services/audit').AuditEntryView[];
	next: number | null;
	people: { id: string; name: string }[];
}
