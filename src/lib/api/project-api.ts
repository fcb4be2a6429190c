import type { z } from 'zod';
import type { PropertyKey } from '$lib/properties';
import type {
	contactPutSchema,
	contactsPatchSchema,
	domainCreateSchema,
	domainUpdateSchema,
	siteUpdateSchema,
	unitCreateSchema,
	unitUpdateSchema,
	zonationCreateSchema,
	zoneBoundarySchema
} from '$lib/schemas/stratigraphy';
import type { variogramSaveSchema } from '$lib/schemas/variogram';
import type { recipeSetupSchema } from '$lib/schemas/recipe';
import type { exportJobSchema, meshUploadOptionsSchema, transferSetSaveSchema, transferTableSaveSchema } from '$lib/schemas/exports';
import type { EnsembleStat } from '$lib/ensemble';
import type { Recipe } from '$lib/geostat';

type In<S extends z.ZodType> = z.input<S>;
import { getJson, send, sendForm } from './http';
import type {
	CommentView,
	ContactView,
	DomainSamples,
	AuditPage,
	Notified,
	RealizationJson,
	RecipeNoteView,
	ExportJobView,
	MeshPreview,
	MeshView,
	ResolvedTransferSet,
	TransferSetView,
	TransferTableView,
	RecipeSummaryView,
	RecipeView,
	WeakZonesJson,
	SummaryJson,
	DomainView,
	SectionView,
	SiteView,
	SoundingDetailView,
	SoundingSummary,
	UnitView,
	VariogramView,
	ZonationView,
	ZoneBoundaryView
} from './views';

/**
 * The typed calls of one project's JSON API (/api/v1/projects/:id/…), as the pages use them: each returns the
 * service's view, unwrapped from its envelope, and rejects with a RequestFailed carrying the API's message.
 * Request bodies take the zod schemas' input types, so a page cannot send what the endpoint would refuse by shape.
 */
export function projectApi(projectId: string) {
	const base = `/api/v1/projects/${encodeURIComponent(projectId)}`;
	const at = (...parts: string[]) => [base, ...parts.map(encodeURIComponent)].join('/');
	return {
		site: async () => (await getJson<{ site: SiteView }>(at('site'))).site,
		updateSite: async (input: In<typeof siteUpdateSchema>) => (await send<{ site: SiteView }>('PATCH', at('site'), input)).site,

		soundings: async () => (await getJson<{ soundings: SoundingSummary[] }>(at('soundings'))).soundings,
		sounding: (soundingId: string) => getJson<SoundingDetailView>(at('soundings', soundingId)),
		deleteSounding: (soundingId: string) => send<void>('DELETE', at('soundings', soundingId)),

		units: async () => (await getJson<{ units: UnitView[] }>(at('units'))).units,
		createUnit: async (input: In<typeof unitCreateSchema>) => (await send<{ unit: UnitView }>('POST', at('units'), input)).unit,
		updateUnit: async (unitId: string, input: In<typeof unitUpdateSchema>) => (await send<{ unit: UnitView }>('PATCH', at('units', unitId), input)).unit,
		deleteUnit: (unitId: string) => send<void>('DELETE', at('units', unitId)),

		contacts: async () => (await getJson<{ contacts: ContactView[] }>(at('contacts'))).contacts,
		putContact: async (input: In<typeof contactPutSchema>) => (await send<{ contact: ContactView }>('PUT', at('contacts'), input)).contact,
		deleteContact: (soundingId: string, unitId: string) => send<void>('DELETE', at('contacts'), { soundingId, unitId }),
		/** Several edits at once, all or nothing; answers what changed and every contact after. */
		editContacts: (input: In<typeof contactsPatchSchema>) =>
			send<{ changed: { set: number; removed: number; interpolated: number }; contacts: ContactView[] }>('PATCH', at('contacts'), input),

		zoneBoundaries: async () => (await getJson<{ boundaries: ZoneBoundaryView[] }>(at('zone-boundaries'))).boundaries,
		createZoneBoundary: async (input: In<typeof zoneBoundarySchema>) =>
			(await send<{ boundary: ZoneBoundaryView }>('POST', at('zone-boundaries'), input)).boundary,
		deleteZoneBoundary: (id: string) => send<void>('DELETE', at('zone-boundaries'), { id }),

		section: (property: PropertyKey) => getJson<SectionView>(`${at('section')}?property=${encodeURIComponent(property)}`),

		zonations: async () => (await getJson<{ zonations: ZonationView[] }>(at('zonations'))).zonations,
		createZonation: async (input: In<typeof zonationCreateSchema>) =>
			(await send<{ zonation: ZonationView }>('POST', at('zonations'), input)).zonation,
		deleteZonation: (zonationId: string) => send<void>('DELETE', at('zonations', zonationId)),
		createDomain: async (zonationId: string, input: In<typeof domainCreateSchema>) =>
			(await send<{ domain: DomainView }>('POST', at('zonations', zonationId), input)).domain,
		updateDomain: async (domainId: string, input: In<typeof domainUpdateSchema>) => (await send<{ domain: DomainView }>('PATCH', at('domains', domainId), input)).domain,
		deleteDomain: (domainId: string) => send<void>('DELETE', at('domains', domainId)),
		domainSamples: (domainId: string) => getJson<DomainSamples>(at('domains', domainId, 'samples')),

		variograms: async (domainId: string) => (await getJson<{ variograms: VariogramView[] }>(at('domains', domainId, 'variograms'))).variograms,
		saveVariogram: async (domainId: string, input: In<typeof variogramSaveSchema>) =>
			(await send<{ variogram: VariogramView }>('POST', at('domains', domainId, 'variograms'), input)).variogram,
		restoreVariogram: async (domainId: string, variogramId: string, note?: string) =>
			(await send<{ variogram: VariogramView }>('POST', at('domains', domainId, 'variograms', variogramId, 'restore'), note === undefined ? undefined : { note }))
				.variogram,
		comments: async (domainId: string, variogramId: string) =>
			(await getJson<{ comments: CommentView[] }>(at('domains', domainId, 'variograms', variogramId, 'comments'))).comments,
		addComment: async (domainId: string, variogramId: string, body: string) =>
			(await send<{ comment: CommentView }>('POST', at('domains', domainId, 'variograms', variogramId, 'comments'), { body })).comment,

		recipes: async () => (await getJson<{ recipes: RecipeSummaryView[] }>(at('recipes'))).recipes,
		recipe: async (recipeId: string) => (await getJson<{ recipe: RecipeView }>(at('recipes', recipeId))).recipe,
		/** Creates a recipe, or returns the one already stored with the same hash. */
		createRecipe: async (input: In<typeof recipeSetupSchema>) => (await send<{ recipe: RecipeView }>('POST', at('recipes'), input)).recipe,
		deleteRecipe: (recipeId: string) => send<void>('DELETE', at('recipes', recipeId)),
		/** The engine's recipe, as its canonical JSON parses. */
		recipeDocument: (recipeId: string) => getJson<Recipe>(at('recipes', recipeId, 'recipe.json')),
		realization: (recipeId: string, r: number) => getJson<RealizationJson>(at('recipes', recipeId, 'realizations', String(r))),
		summary: (recipeId: string, stat: EnsembleStat, threshold?: number) =>
			getJson<SummaryJson>(`${at('recipes', recipeId, 'summary')}?stat=${stat}${stat === 'below' && threshold !== undefined ? `&threshold=${encodeURIComponent(String(threshold))}` : ''}`),
		/** Weak-zone continuity over the recipe's realizations (computed on the server, cached). */
		weakZones: (recipeId: string, q: { property: string; threshold: number; minLength?: number; boundary?: string | null }) => {
			const params = new URLSearchParams({ property: q.property, threshold: String(q.threshold) });
			if (q.minLength !== undefined) params.set('minLength', String(q.minLength));
			if (q.boundary) params.set('boundary', q.boundary);
			return getJson<WeakZonesJson>(`${at('recipes', recipeId, 'weak-zones')}?${params}`);
		},
		recipeNotes: async (recipeId: string) => (await getJson<{ comments: RecipeNoteView[] }>(at('recipes', recipeId, 'comments'))).comments,
		commentOnRecipe: (recipeId: string, body: string) => send<{ comment: RecipeNoteView } & Notified>('POST', at('recipes', recipeId, 'comments'), { body }),
		requestReview: (recipeId: string, note: string) => send<{ recipe: RecipeView } & Notified>('POST', at('recipes', recipeId, 'review'), { note }),
		approveRecipe: (recipeId: string, comment: string) => send<{ recipe: RecipeView } & Notified>('POST', at('recipes', recipeId, 'approval'), { comment }),

		audit: (q: { kind?: string | null; user?: string | null; before?: number | null } = {}) => getJson<AuditPage>(`${at('audit')}?${auditParams(q)}`),

		meshes: async () => (await getJson<{ meshes: MeshView[] }>(at('meshes'))).meshes,
		/** The mapping step of a mesh upload: header, first rows and a guessed mapping. */
		previewMesh: (file: File) => {
			const body = new FormData();
			body.append('file', file);
			return sendForm<{ file: string; preview: MeshPreview }>(at('meshes', 'preview'), body);
		},
		uploadMesh: async (file: File, options: In<typeof meshUploadOptionsSchema>) => {
			const body = new FormData();
			body.append('file', file);
			body.append('options', JSON.stringify(options));
			return (await sendForm<{ mesh: MeshView }>(at('meshes'), body)).mesh;
		},
		deleteMesh: (meshId: string) => send<void>('DELETE', at('meshes', meshId)),

		transferTables: async () => (await getJson<{ tables: TransferTableView[] }>(at('transfer-tables'))).tables,
		saveTransferTable: async (input: In<typeof transferTableSaveSchema>) => (await send<{ table: TransferTableView }>('POST', at('transfer-tables'), input)).table,
		transferSets: async () => (await getJson<{ sets: TransferSetView[] }>(at('transfer-sets'))).sets,
		transferSet: async (setId: string) => (await getJson<{ set: ResolvedTransferSet }>(at('transfer-sets', setId))).set,
		saveTransferSet: async (input: In<typeof transferSetSaveSchema>) => (await send<{ set: ResolvedTransferSet }>('POST', at('transfer-sets'), input)).set,

		exports: async () => (await getJson<{ exports: ExportJobView[] }>(at('exports'))).exports,
		exportJob: async (exportId: string) => (await getJson<{ export: ExportJobView }>(at('exports', exportId))).export,
		startExport: async (input: In<typeof exportJobSchema>) => (await send<{ export: ExportJobView }>('POST', at('exports'), input)).export,
		/** Cancels a job that runs, or deletes a finished one and its file. */
		deleteExport: (exportId: string) => send<void>('DELETE', at('exports', exportId)),

		/** Addresses of the file downloads, for links (streamed by the server). */
		files: {
			realizationCsv: (recipeId: string, r: number, query = '') => `${at('recipes', recipeId, 'realizations', `${r}.csv`)}${query}`,
			realizationVtk: (recipeId: string, r: number, query = '') => `${at('recipes', recipeId, 'realizations', `${r}.vtk`)}${query}`,
			zip: (recipeId: string, query: string) => `${at('recipes', recipeId, 'export.zip')}${query}`,
			mapsCsv: (recipeId: string, query = '') => `${at('recipes', recipeId, 'maps.csv')}${query}`,
			mapsVtk: (recipeId: string, query = '') => `${at('recipes', recipeId, 'maps.vtk')}${query}`,
			exportDownload: (exportId: string) => at('exports', exportId, 'download')
		},
		/** Addresses of the CSV downloads, for links. */
		csv: {
			audit: (q: { kind?: string | null; user?: string | null } = {}) => `${at('audit.csv')}?${auditParams(q)}`,
			contacts: at('contacts.csv'),
			readings: (soundingIds: string[]) => `${at('soundings', 'readings.csv')}?s=${soundingIds.map(encodeURIComponent).join(',')}`,
			domainStatistics: (domainId: string) => at('domains', domainId, 'statistics.csv'),
			zonationStatistics: (zonationId: string) => at('zonations', zonationId, 'statistics.csv')
		}
	};
}

function auditParams(q: { kind?: string | null; user?: string | null; before?: number | null }): string {
	const p = new URLSearchParams();
	if (q.kind) p.set('kind', q.kind);
	if (q.user) p.set('user', q.user);
	if (q.before) p.set('before', String(q.before));
	return p.toString();
}

/** The calls of one project's API; pages create it once and hand it to their components. */
export type ProjectApi = ReturnType<typeof projectApi>;
