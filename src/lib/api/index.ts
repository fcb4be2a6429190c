// The browser's one way to the JSON API: fetch helpers, the typed calls of a project, and the services' views.
export { RequestFailed, getJson, send, sendForm } from './http';
export type { ApiIssue } from './http';
export { projectApi } from './project-api';
export type { ProjectApi } from './project-api';
export type {
	ProjectView,
	SiteView,
	UnitView,
	ContactView,
	ZoneBoundaryView,
	SectionView,
	SectionContact,
	ZonationView,
	DomainView,
	DomainMemberView,
	DomainSamples,
	DomainStats,
	Cdf,
	SoundingSummary,
	SoundingDetailView,
	JsonColumn,
	UnitAtSoundingView,
	ImportResult,
	FileProblem,
	VariogramView,
	CommentView,
	PersonView,
	RecipeSummaryView,
	RecipeView,
	RecipeProvenance,
	ProvenanceDomain,
	ApprovalView,
	RecipeNoteView,
	Notified,
	AuditEntryView,
	AuditPage,
	RealizationJson,
	SummaryJson,
	WeakZonesJson
} from './views';
