/**
 * Exports of a recipe's realizations and ensemble maps as files: CSV per realization, legacy VTK, and a ZIP of
 * many with a manifest and recipe.json. Everything streams from regeneration on the server's worker pool
 * (streamRealizations): a file is written as it is read, memory holds a realization or two, a slow reader holds the
 * workers back, and a reader that goes away stops the work. The same writers serve downloads and export jobs, so
 * both give the same bytes for the same request.
 */
import { Readable } from 'node:stream';
import ZipStream from 'zip-stream';
import { ENSEMBLE_STATS, type EnsembleStat } from '$lib/ensemble';
import { parseRecipeDocument, targetsFromDefinition, type Recipe } from '$lib/geostat';
import { PROPERTY_INFO } from '$lib/properties';
import { CancelledError } from '$lib/cancelled-error';
import { TRANSFER_RELATIONS } from '$lib/schemas/exports';
import { stressReader } from '$lib/site';
import { and, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { projects } from '$lib/server/db/schema';
import { recipes } from '$lib/server/db/recipe-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
import { ServiceError } from '$lib/server/errors';
import { keptRealization, streamRealizations } from '$lib/server/realizations';
import { safeFileName } from '$lib/server/download';
import { csvHeader, csvRows, mapsCsv, propertyHeaders, type CsvLayout } from '$lib/server/exports/csv';
import { headerOf, leadingHeaders, planTransfers, propertiesOf, type ExportDomain, type ExportTargets } from '$lib/server/exports/table';
import { vtkArray, vtkGeometry, vtkName } from '$lib/server/exports/vtk';
import { meshElements } from './meshes';
import type { RecipeProvenance } from './recipe-resolve';
import { projectStratigraphy } from './recipe-resolve';
import { listSoundings } from './soundings';
import { getSite } from './site';
import { listUnits } from './stratigraphy';
import { recipeDocument } from './recipes';
import { recipeSummary } from './summaries';
import { resolvedTransferSet, type ResolvedTransferSet } from './transfers';

/** The caution every export carries, in its manifest and on the Exports page. */
export const EXPORT_CAUTION =
	'These property fields and the parameters derived from them support, and do not replace, the judgement of a licensed engineer and the local codes: they are only as good as the soundings, the stratigraphy, the variograms and the transfer relations they come from.';

/** Names of the ensemble maps as columns and arrays. */
const MAP_HEADERS: Record<EnsembleStat, string> = { mean: 'mean', sd: 'sd', p10: 'P10', p50: 'P50', p90: 'P90', below: 'P_below' };

/** Everything an export of one recipe needs, loaded once. */
export interface ExportContext {
	project: { id: string; name: string };
	/** `document()` reads the recipe's stored canonical JSON (for recipe.json and the queue; not held meanwhile). */
	recipe: { id: string; name: string; hash: string; engineVersion: string; realizations: number; createdAt: Date; document(): string };
	engine: Recipe;
	provenance: RecipeProvenance;
	targets: ExportTargets;
	domains: ExportDomain[];
	transfer: ResolvedTransferSet | null;
	/** σ′v at each target where a transfer needs it (NaN elsewhere), computed on first use. */
	sigmaVeff(target: number): number;
	/** Remarks for the manifest (assumed groundwater …). */
	notes: string[];
}

/**
 * Loads a recipe of the project for export, with its targets (a grid's cells, or a mesh's elements with their ids
 * and groups) and, when asked, a transfer set of the project.
 * @throws ServiceError 404 for a recipe or transfer set not in the project; 409 for a recipe of another engine
 *   version, or a mesh recipe whose mesh is gone
 */
export function exportContext(projectId: string, recipeId: string, transferSetId: string | null, db: DbOrTx = getDb()): ExportContext {
	const row = db
		.select()
		.from(recipes)
		.innerJoin(projects, eq(projects.id, recipes.projectId))
		.where(and(eq(recipes.id, recipeId), eq(recipes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Recipe not found.');
	const r = row.recipes;
	const transfer = transferSetId ? resolvedTransferSet(projectId, transferSetId, db) : null;
	// The document was validated when it was stored (its hash names it); parsing without the schema keeps a
	// mesh recipe of two million targets from holding the server's thread for seconds.
	const engine = parseRecipeDocument(r.document, { shared: true });
	const provenance = r.provenance as RecipeProvenance;
	const site = getSite(projectId, db);
	const targets = exportTargets(projectId, engine, provenance, site.lengthUnit, db);
	const domains: ExportDomain[] = provenance.domains.filter((d) => d.index !== null).map((d) => ({ index: d.index!, name: d.name, property: d.property }));
	const notes: string[] = [];
	let stress: Float64Array | null = null;
	const ctx: ExportContext = {
		project: { id: row.projects.id, name: row.projects.name },
		recipe: {
			id: r.id,
			name: r.name,
			hash: r.hash,
			engineVersion: r.engineVersion,
			realizations: r.realizations,
			createdAt: r.createdAt,
			document: () => storedDocument(projectId, r.id, r.hash, db)
		},
		engine,
		provenance,
		targets,
		domains,
		transfer,
		notes,
		sigmaVeff(target) {
			stress ??= elementStresses(projectId, ctx, db);
			return stress[target];
		}
	};
	return ctx;
}

/** The stored document of a recipe, read again (an export does not hold it). @throws ServiceError 404, 409 when it has gone */
function storedDocument(projectId: string, recipeId: string, hash: string, db: DbOrTx): string {
	const stored = recipeDocument(projectId, recipeId, db);
	if (stored.hash !== hash) throw new ServiceError(409, 'The recipe changed while it was being exported.');
	return stored.text;
}

/** A recipe's targets as files list them. */
function exportTargets(projectId: string, engine: Recipe, p: RecipeProvenance, lengthUnit: 'm' | 'ft', db: DbOrTx): ExportTargets {
	const geometry = p.geometry;
	if (engine.targets.kind === 'points') {
		if (!p.mesh) throw new ServiceError(409, 'This recipe’s targets are points of no stored mesh; it cannot be exported with element ids.');
		let cols: ReturnType<typeof meshElements>;
		try {
			cols = meshElements(projectId, p.mesh.id, db);
		} catch {
			throw new ServiceError(409, `The mesh ${p.mesh.name} this recipe was made on has been deleted; its element ids are gone.`);
		}
		const t = engine.targets;
		return { kind: 'mesh', geometry, lengthUnit, x: t.x, y: t.y, z: t.z, domain: t.domain, grid: null, ids: cols.ids, group: cols.group };
	}
	const expanded = targetsFromDefinition(engine.targets);
	const g = p.grid!;
	const counts = engine.targets.kind === 'grid' ? engine.targets.counts : { x: engine.targets.x.length, y: engine.targets.y.length, z: engine.targets.z.length };
	const along = (a: { from: number; cell: number }, n: number) => Array.from({ length: n + 1 }, (_, i) => a.from + i * a.cell);
	const edges =
		g.geometry === '2d'
			? { x: along(g.chainage, counts.x), y: [0], z: g.zEdges ?? along(g.elevation, counts.z) }
			: { x: along(g.x, counts.x), y: along(g.y, counts.y), z: g.zEdges ?? along(g.elevation, counts.z) };
	return { kind: 'grid', geometry, lengthUnit, x: expanded.x, y: expanded.y, z: expanded.z, domain: expanded.domain, grid: { counts, edges }, ids: null, group: null };
}

/** σ′v at every target of a domain simulated in su/σ′v (NaN elsewhere), from the stratigraphy as it stands now. */
function elementStresses(projectId: string, ctx: ExportContext, db: DbOrTx): Float64Array {
	const { targets, domains } = ctx;
	const n = targets.domain.length;
	const out = new Float64Array(n).fill(NaN);
	const needs = new Set(domains.filter((d) => d.property === 'suRatio').map((d) => d.index));
	if (needs.size === 0) return out;
	const site = getSite(projectId, db);
	const units = listUnits(projectId, db);
	const soundings = listSoundings(projectId, db);
	const assumed = site.groundwaterElevation === null && soundings.some((s) => s.groundwaterElevation === null);
	const water = soundings.map((s) => ({ chainage: s.chainage, x: s.x, y: s.y, groundwater: s.groundwaterElevation ?? site.groundwaterElevation ?? s.groundElevation }));
	const at = stressReader(projectStratigraphy(projectId, db), units.map((u) => ({ gammaAbove: u.gammaAbove, gammaBelow: u.gammaBelow })), water, site.geometry);
	for (let i = 0; i < n; i++) {
		if (!needs.has(targets.domain[i])) continue;
		const s = at(targets.x[i], targets.geometry === '2d' ? 0 : targets.y[i], targets.z[i]);
		out[i] = s ? s.sigmaVeff : NaN;
	}
	ctx.notes.push(
		`su = su/σ′v × σ′v: σ′v at each element from the units’ weights above and below the water table and the groundwater interpolated between the soundings, as the stratigraphy stood at the export${assumed ? '; where no groundwater elevation is set the water table is taken at the ground surface (the cautious assumption)' : ''}.`
	);
	return out;
}

/** The file-name stem of an export: project, recipe. */
export function fileStem(ctx: ExportContext): string {
	return `${safeFileName(ctx.project.name)}_${safeFileName(ctx.recipe.name)}`;
}

/** @throws ServiceError 404 for a realization outside 0 … N − 1 */
export function checkRealizations(ctx: ExportContext, list: number[]): void {
	const n = ctx.recipe.realizations;
	const bad = list.find((r) => !Number.isSafeInteger(r) || r < 0 || r >= n);
	if (bad !== undefined) throw new ServiceError(404, `Realization ${bad} does not exist: the recipe has ${n} (0 … ${n - 1}).`);
	if (ctx.engine.engineVersion !== ctx.recipe.engineVersion) throw new ServiceError(409, 'The recipe’s document does not match its engine version.');
}

/** The CSV layout of an export: its columns and each domain's transfers. */
export function csvLayout(ctx: ExportContext): CsvLayout {
	const properties = propertiesOf(ctx.domains);
	const taken = new Set([...leadingHeaders(ctx.targets), ...propertyHeaders(properties)]);
	const { outputs, perDomain } = planTransfers(ctx.transfer, ctx.domains, (t) => ctx.sigmaVeff(t), taken);
	return { targets: ctx.targets, domains: ctx.domains, properties, outputs, perDomain };
}

/** Realizations in order: from the ensemble kept in memory when it is there, else regenerated on the pool. */
async function* realizationsOf(ctx: ExportContext, list: number[], signal: AbortSignal, onProgress?: (done: number, total: number) => void): AsyncGenerator<[number, Float64Array]> {
	const kept = list.map((r) => keptRealization(ctx.recipe.hash, r));
	if (kept.every((v) => v !== undefined)) {
		for (let k = 0; k < list.length; k++) yield [list[k], kept[k]!];
		return;
	}
	yield* streamRealizations(ctx.engine, list, { signal, onProgress, identity: { hash: ctx.recipe.hash, document: ctx.recipe.document } });
}

/**
 * One realization as CSV: the header at once (the first bytes reach the reader before regeneration finishes), then
 * the rows as the realization arrives.
 */
export async function* realizationCsv(ctx: ExportContext, r: number, digits: number | null, signal: AbortSignal): AsyncGenerator<string> {
	const layout = csvLayout(ctx);
	yield csvHeader(layout);
	for await (const [, values] of realizationsOf(ctx, [r], signal)) yield* csvRows(layout, values, digits);
}

/** The arrays of one realization for VTK: each property (NaN in other domains) and each transferred parameter. */
function realizationArrays(layout: CsvLayout, values: Float64Array, suffix: string): { name: string; values: Float64Array }[] {
	const { targets, domains, properties, outputs, perDomain } = layout;
	const n = values.length;
	const byProperty = properties.map(() => new Float64Array(n).fill(NaN));
	const byOutput = outputs.map(() => new Float64Array(n).fill(NaN));
	const column = domains.map(() => -1);
	for (const d of domains) column[d.index] = properties.indexOf(d.property);
	for (let i = 0; i < n; i++) {
		const d = targets.domain[i];
		if (d < 0) continue;
		byProperty[column[d]][i] = values[i];
		for (const { column: c, of } of perDomain[d]) byOutput[c][i] = of(values[i], i);
	}
	return [
		...properties.map((p, k) => ({ name: `${p}${suffix}`, values: byProperty[k] })),
		...outputs.map((o, k) => ({ name: `${o.header.replace(/ \(.*\)$/, '')}${suffix}`, values: byOutput[k] }))
	];
}

/**
 * Realizations and ensemble maps as one legacy VTK file: the geometry, the domain index, then each realization's
 * arrays (named with _rNNN when there are several) as it arrives, then the maps.
 */
export async function* realizationsVtk(
	ctx: ExportContext,
	list: number[],
	maps: { stat: EnsembleStat; threshold: number | null }[],
	signal: AbortSignal,
	onProgress?: (done: number, total: number) => void
): AsyncGenerator<Uint8Array> {
	const layout = csvLayout(ctx);
	yield* vtkGeometry(ctx.targets, `Conefield ${ctx.project.name} / ${ctx.recipe.name} (recipe ${ctx.recipe.hash.slice(0, 12)})`);
	yield* vtkArray('domain', ctx.targets.domain, 'int');
	const several = list.length > 1;
	for await (const [r, values] of realizationsOf(ctx, list, signal, onProgress)) {
		for (const a of realizationArrays(layout, values, several ? `_r${String(r).padStart(3, '0')}` : '')) yield* vtkArray(a.name, a.values);
	}
	for (const m of await mapValues(ctx, maps)) yield* vtkArray(m.header, m.values);
}

/** The ensemble maps asked for, each over the recipe's N realizations (cached summaries, or computed on the pool). */
async function mapValues(ctx: ExportContext, maps: { stat: EnsembleStat; threshold: number | null }[]): Promise<{ header: string; values: Float64Array }[]> {
	const out: { header: string; values: Float64Array }[] = [];
	for (const m of maps) {
		const s = await recipeSummary(ctx.project.id, ctx.recipe.id, m.stat, m.threshold);
		out.push({ header: m.stat === 'below' ? `P_below_${String(m.threshold).replace(/[^0-9A-Za-z]+/g, '_')}` : MAP_HEADERS[m.stat], values: s.values });
	}
	return out;
}

/** The ensemble maps asked for (default all but P(below)), as `{stat, threshold}`. */
export function mapsAsked(stats: EnsembleStat[] | undefined, threshold: number | null): { stat: EnsembleStat; threshold: number | null }[] {
	const list = stats ?? ENSEMBLE_STATS.filter((s) => s !== 'below');
	return list.map((stat) => ({ stat, threshold: stat === 'below' ? threshold : null }));
}

/** Ensemble maps as CSV: a column per map, the property each row's values are of. */
export async function* mapsCsvFile(ctx: ExportContext, maps: { stat: EnsembleStat; threshold: number | null }[], digits: number | null): AsyncGenerator<string> {
	yield* mapsCsv(ctx.targets, ctx.domains, await mapValues(ctx, maps), digits);
}

/** A request for a ZIP of realizations (export.zip and export jobs alike). */
export interface ZipRequest {
	realizations: number[];
	format: 'csv' | 'vtk';
	digits: number | null;
	maps: { stat: EnsembleStat; threshold: number | null }[];
}

/** File names inside a ZIP: realization r's CSV, the VTK, the maps. */
function entryNames(ctx: ExportContext, req: ZipRequest) {
	const stem = fileStem(ctx);
	const width = Math.max(3, String(ctx.recipe.realizations - 1).length);
	return {
		csv: (r: number) => `${stem}_r${String(r).padStart(width, '0')}.csv`,
		vtk: `${stem}_${rangeText(req.realizations)}.vtk`,
		maps: `${stem}_maps.csv`
	};
}

/** "0-19", "0-3_7_9-11": the realizations of a file name. */
export function rangeText(list: number[]): string {
	const parts: string[] = [];
	for (let k = 0; k < list.length; ) {
		let m = k;
		while (m + 1 < list.length && list[m + 1] === list[m] + 1) m++;
		parts.push(m === k ? `r${list[k]}` : `r${list[k]}-${list[m]}`);
		k = m + 1;
	}
	return parts.join('_');
}

/** The name of the ZIP of a request. */
export function zipFileName(ctx: ExportContext, req: Pick<ZipRequest, 'realizations' | 'format'>): string {
	return `${fileStem(ctx)}_${rangeText(req.realizations)}_${req.format}.zip`;
}

/**
 * A ZIP of realizations, streamed as it is built (zip-stream): recipe.json first (byte for byte the recipe's
 * canonical JSON), then each realization's CSV as it is regenerated (or one VTK holding them all), the maps, and
 * manifest.json last (it counts the values held at a table's ends while the files were written). Entries are
 * dated at the recipe's creation, so the same request always gives the same bytes. `signal` stops the work.
 */
export function zipStream(ctx: ExportContext, req: ZipRequest, signal: AbortSignal, onProgress?: (done: number, total: number) => void): Readable {
	const estimate = ctx.targets.domain.length * (req.realizations.length + req.maps.length) * 120;
	const zip = new ZipStream({ zlib: { level: 6 }, forceZip64: estimate > 3.5e9 });
	const date = ctx.recipe.createdAt;
	const stopped = new Promise<never>((_, reject) => {
		const stop = () => reject(new CancelledError());
		if (signal.aborted) stop();
		signal.addEventListener('abort', stop, { once: true });
	});
	stopped.catch(() => undefined);
	const add = (source: Readable | string | Buffer, name: string) =>
		Promise.race([new Promise<void>((resolve, reject) => zip.entry(source, { name, date }, (err) => (err ? reject(err) : resolve()))), stopped]);
	const layout = csvLayout(ctx);
	const names = entryNames(ctx, req);
	const files: string[] = ['recipe.json'];
	(async () => {
		await add(ctx.recipe.document(), 'recipe.json');
		if (req.format === 'csv') {
			for await (const [r, values] of realizationsOf(ctx, req.realizations, signal, onProgress)) {
				const rows = (function* () {
					yield csvHeader(layout);
					yield* csvRows(layout, values, req.digits);
				})();
				await add(Readable.from(rows), names.csv(r));
				files.push(names.csv(r));
			}
			if (req.maps.length) {
				await add(Readable.from(mapsCsv(ctx.targets, ctx.domains, await mapValues(ctx, req.maps), req.digits)), names.maps);
				files.push(names.maps);
			}
		} else {
			await add(Readable.from(realizationsVtk(ctx, req.realizations, req.maps, signal, onProgress)), names.vtk);
			files.push(names.vtk);
		}
		files.push('manifest.json');
		await add(JSON.stringify(manifest(ctx, req, layout, files), null, 2) + '\n', 'manifest.json');
		zip.finalize();
	})().catch((err) => {
		if (!(err instanceof CancelledError) && !signal.aborted) console.error('[export]', err);
		zip.destroy(err instanceof Error ? err : new Error(String(err)));
	});
	zip.once('close', () => undefined);
	return zip;
}

/** What a ZIP holds and how to read it: recipe, realizations, units, columns, transfer set and tables, notes, the caution. */
export function manifest(ctx: ExportContext, req: ZipRequest, layout: CsvLayout, files: string[]) {
	const u = ctx.targets.lengthUnit;
	const held = layout.outputs.filter((o) => o.held.below + o.held.above > 0);
	const relations = [...new Set(layout.outputs.flatMap((o) => (o.relation ? [o.relation] : [])))];
	return {
		manifest: 'conefield-export/1',
		project: ctx.project,
		recipe: { id: ctx.recipe.id, name: ctx.recipe.name, hash: ctx.recipe.hash, engineVersion: ctx.recipe.engineVersion, realizations: ctx.recipe.realizations },
		realizations: req.realizations,
		format: req.format,
		numbers: req.digits === null ? 'shortest round-trip form: each value parses to the regenerated double exactly' : `${req.digits} significant digits`,
		files,
		targets:
			ctx.targets.kind === 'grid'
				? { kind: 'grid', geometry: ctx.targets.geometry, counts: ctx.targets.grid!.counts, cellEdges: ctx.targets.grid!.edges }
				: { kind: 'mesh', geometry: ctx.targets.geometry, mesh: ctx.provenance.mesh ?? null, elements: ctx.targets.domain.length },
		units: { length: u, stress: 'kPa', coordinates: ctx.targets.geometry === '2d' ? `chainage and elevation in ${u}` : `easting, northing and elevation in ${u}` },
		columns: [
			...leadingHeaders(ctx.targets).map((h) => ({ name: h, unit: /\((m|ft)\)$/.test(h) ? u : '', description: leadingDescription(h) })),
			...layout.properties.map((p) => ({ name: headerOf(p, PROPERTY_INFO[p].unit), unit: PROPERTY_INFO[p].unit, description: `${PROPERTY_INFO[p].description}: the simulated value, in the domains simulated in it` })),
			...layout.outputs.map((o) => ({ name: o.header, unit: o.unit, description: o.source }))
		],
		vtkArrays: req.format === 'vtk' ? 'domain (int), then per realization each property and parameter (suffix _rNNN), then the maps; NaN where a value does not apply' : undefined,
		domains: ctx.domains,
		maps: req.maps.map((m) => ({ stat: m.stat, threshold: m.threshold, over: `${ctx.recipe.realizations} realizations` })),
		transfer: ctx.transfer
			? {
					set: { id: ctx.transfer.id, name: ctx.transfer.name, version: ctx.transfer.version, rules: ctx.transfer.rules, note: ctx.transfer.note },
					tables: ctx.transfer.tables,
					relations: relations.map((r) => ({ key: r, ...TRANSFER_RELATIONS[r] }))
				}
			: null,
		notes: [
			...ctx.notes,
			...held.map(
				(o) =>
					o.table
						? `${o.header}: ${o.held.below.toLocaleString('en')} value(s) fell below and ${o.held.above.toLocaleString('en')} above table ${o.table.name} version ${o.table.version} and were held at its end points.`
						: `${o.header}: ${o.held.below.toLocaleString('en')} value(s) below and ${o.held.above.toLocaleString('en')} above the relation’s range (${o.relation ? TRANSFER_RELATIONS[o.relation].range.join(' – ').replace('-Infinity', '−∞').replace('Infinity', '∞') : ''}) were computed at its end.`
			)
		],
		caution: EXPORT_CAUTION
	};
}

function leadingDescription(h: string): string {
	if (h === 'cell') return 'target index in the engine’s order (x fastest, then y, then z)';
	if (h === 'i' || h === 'j' || h === 'k') return `cell index along ${h === 'i' ? 'x' : h === 'j' ? 'y' : 'the elevation, from the bottom'}`;
	if (h === 'element') return 'element id as uploaded';
	if (h === 'group') return 'element group as uploaded';
	if (h === 'domain') return 'the domain the target lies in (blank: not simulated)';
	return 'cell centre or element centroid';
}

/** Every realization of a recipe named in the request, checked. */
export function zipRequest(ctx: ExportContext, q: { realizations: number[]; format: 'csv' | 'vtk'; digits?: number | null; maps?: EnsembleStat[]; threshold: number | null }): ZipRequest {
	checkRealizations(ctx, q.realizations);
	return { realizations: q.realizations, format: q.format, digits: q.digits ?? null, maps: (q.maps ?? []).map((stat) => ({ stat, threshold: stat === 'below' ? q.threshold : null })) };
}

/** The VTK array name of a map header (for tests and docs). */
export const mapArrayName = (stat: EnsembleStat) => vtkName(MAP_HEADERS[stat]);
