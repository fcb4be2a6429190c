import { RequestFailed, type ExportJobView, type MeshPreview, type MeshView, type ProjectApi, type RecipeSummaryView, type RecipeView, type TransferSetView, type TransferTableView } from '$lib/api';
import type { EnsembleStat } from '$lib/ensemble';

/** The download being set up: recipe, realizations, format, numbers, transfer set, ensemble maps. */
export interface DownloadChoice {
	recipeId: string;
	realizations: string;
	format: 'csv' | 'vtk';
	/** '' for the shortest round-trip form. */
	digits: string;
	/** '' for no transfer. */
	transferSetId: string;
	maps: EnsembleStat[];
	threshold: string;
}

/** Bytes a CSV cell takes on average in our files (a number in shortest form and its comma): for the size estimate. */
const BYTES_PER_CELL = 17;
/** Above this estimate a download is better run as an export job. */
export const LARGE_BYTES = 200 * 1024 * 1024;

/** "1.4 MB", "230 kB". */
export function sizeText(bytes: number): string {
	if (bytes >= 1e9) return `${(bytes / 1e9).toFixed(1)} GB`;
	if (bytes >= 1e6) return `${(bytes / 1e6).toFixed(1)} MB`;
	return `${Math.max(1, Math.round(bytes / 1e3))} kB`;
}

/** How many realizations "0-19,25" names, or null when it does not read. */
export function countRealizations(text: string): number | null {
	let n = 0;
	for (const part of text.split(',')) {
		const m = /^\s*(\d{1,6})\s*(?:-\s*(\d{1,6})\s*)?$/.exec(part);
		if (!m) return null;
		const a = Number(m[1]);
		const b = m[2] === undefined ? a : Number(m[2]);
		if (b < a) return null;
		n += b - a + 1;
	}
	return n;
}

/**
 * The Exports page: the project's recipes to export, the download being set up (streamed now, or run as an export
 * job), the jobs with their progress (polled while any runs) and cancel, the uploaded meshes with the upload's
 * mapping step, and the transfer tables and sets.
 */
export class ExportsPage {
	recipes = $state.raw<RecipeSummaryView[]>([]);
	recipe = $state.raw<RecipeView | null>(null);
	jobs = $state.raw<ExportJobView[]>([]);
	meshes = $state.raw<MeshView[]>([]);
	tables = $state.raw<TransferTableView[]>([]);
	sets = $state.raw<TransferSetView[]>([]);
	geometry = $state<'2d' | '3d'>('2d');
	choice = $state<DownloadChoice>({ recipeId: '', realizations: '', format: 'csv', digits: '', transferSetId: '', maps: [], threshold: '' });
	loading = $state(true);
	problem = $state('');
	notice = $state('');
	starting = $state(false);
	/** The mesh upload in progress: the file, its preview and the mapping chosen. */
	upload = $state<{ file: File | null; preview: MeshPreview | null; name: string; mapping: Record<'id' | 'x' | 'y' | 'z' | 'group', string>; busy: boolean; problem: string }>({
		file: null,
		preview: null,
		name: '',
		mapping: { id: '', x: '', y: '', z: '', group: '' },
		busy: false,
		problem: ''
	});

	private timer: ReturnType<typeof setTimeout> | null = null;

	constructor(private readonly api: ProjectApi) {}

	async start(): Promise<void> {
		try {
			const [recipes, jobs, meshes, tables, sets, site] = await Promise.all([
				this.api.recipes(),
				this.api.exports(),
				this.api.meshes(),
				this.api.transferTables(),
				this.api.transferSets(),
				this.api.site()
			]);
			this.geometry = site.geometry;
			this.recipes = recipes;
			this.jobs = jobs;
			this.meshes = meshes;
			this.tables = tables;
			this.sets = sets;
			if (recipes[0]) await this.chooseRecipe(recipes[0].id);
			this.poll();
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.loading = false;
		}
	}

	destroy(): void {
		if (this.timer) clearTimeout(this.timer);
		this.timer = null;
	}

	async chooseRecipe(id: string): Promise<void> {
		this.choice.recipeId = id;
		const summary = this.recipes.find((r) => r.id === id);
		this.choice.realizations = summary ? `0-${summary.realizations - 1}` : '';
		this.recipe = summary ? await this.api.recipe(id) : null;
	}

	/** Targets of the chosen recipe (cells or elements). */
	readonly targets = $derived.by(() => {
		const p = this.recipe?.provenance;
		if (!p) return 0;
		return p.grid ? p.grid.cells : (p.mesh?.elements ?? 0);
	});

	/** The download's size, estimated from targets × realizations × columns (before compression). */
	readonly estimate = $derived.by(() => {
		const n = countRealizations(this.choice.realizations);
		if (n === null || !this.recipe) return null;
		const columns = 8 + (this.choice.transferSetId ? 3 : 0);
		return this.targets * (n + this.choice.maps.length) * columns * (this.choice.format === 'vtk' ? 8 / 6 : 1) * BYTES_PER_CELL;
	});

	/** The query of export.zip (and the body of an export job) for the choice. */
	query(): string {
		const c = this.choice;
		const q = new URLSearchParams({ realizations: c.realizations.replace(/\s+/g, ''), format: c.format });
		if (c.digits.trim()) q.set('digits', c.digits.trim());
		if (c.transferSetId) q.set('transfer', c.transferSetId);
		if (c.maps.length) q.set('maps', c.maps.join(','));
		if (c.maps.includes('below') && c.threshold.trim()) q.set('threshold', c.threshold.trim());
		return `?${q}`;
	}

	/** The address of the streamed ZIP of the choice. */
	zipHref(): string {
		return this.choice.recipeId ? this.api.files.zip(this.choice.recipeId, this.query()) : '';
	}

	/** The address of one realization's file. */
	fileHref(r: number, format: 'csv' | 'vtk'): string {
		const q = new URLSearchParams();
		if (format === 'csv' && this.choice.digits.trim()) q.set('digits', this.choice.digits.trim());
		if (this.choice.transferSetId) q.set('transfer', this.choice.transferSetId);
		const qs = q.size ? `?${q}` : '';
		return format === 'csv' ? this.api.files.realizationCsv(this.choice.recipeId, r, qs) : this.api.files.realizationVtk(this.choice.recipeId, r, qs);
	}

	/** Runs the choice as an export job. */
	async startJob(): Promise<void> {
		this.starting = true;
		this.problem = '';
		try {
			const c = this.choice;
			const job = await this.api.startExport({
				recipeId: c.recipeId,
				realizations: c.realizations.replace(/\s+/g, ''),
				format: c.format,
				digits: c.digits.trim() ? Number(c.digits) : null,
				transferSetId: c.transferSetId || null,
				maps: c.maps,
				threshold: c.maps.includes('below') && c.threshold.trim() ? Number(c.threshold) : null
			});
			this.jobs = [job, ...this.jobs];
			this.notice = 'The export runs on the server; it is listed below, and you will get an e-mail when its file is ready.';
			this.poll();
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.starting = false;
		}
	}

	/** Cancels a running job or deletes a finished one. */
	async removeJob(id: string): Promise<void> {
		try {
			await this.api.deleteExport(id);
			this.jobs = await this.api.exports();
		} catch (err) {
			this.problem = (err as Error).message;
		}
	}

	/** Refreshes the jobs every second while any is queued or running. */
	private poll(): void {
		if (this.timer) clearTimeout(this.timer);
		if (!this.jobs.some((j) => j.status === 'queued' || j.status === 'running')) return;
		this.timer = setTimeout(async () => {
			try {
				this.jobs = await this.api.exports();
			} catch {
				// a missed refresh is retried at the next tick
			}
			this.poll();
		}, 1000);
	}

	/** Step one of a mesh upload: the file's header and first rows, and a guessed mapping. */
	async previewMesh(file: File): Promise<void> {
		const u = this.upload;
		u.file = file;
		u.problem = '';
		u.preview = null;
		u.busy = true;
		try {
			const { preview } = await this.api.previewMesh(file);
			u.preview = preview;
			u.name = file.name.replace(/\.[^.]+$/, '');
			u.mapping = { id: preview.guess.id ?? '', x: preview.guess.x ?? '', y: preview.guess.y ?? '', z: preview.guess.z ?? '', group: preview.guess.group ?? '' };
		} catch (err) {
			u.problem = (err as Error).message;
		} finally {
			u.busy = false;
		}
	}

	/** Step two: the upload with the mapping; nothing is stored when the file is refused. */
	async uploadMesh(): Promise<void> {
		const u = this.upload;
		if (!u.file) return;
		u.busy = true;
		u.problem = '';
		try {
			const m = u.mapping;
			const mesh = await this.api.uploadMesh(u.file, {
				name: u.name,
				mapping: { id: m.id, x: m.x, z: m.z, ...(m.y ? { y: m.y } : {}), ...(m.group ? { group: m.group } : {}), delimiter: u.preview?.delimiter }
			});
			this.meshes = [...this.meshes, mesh].sort((a, b) => a.name.localeCompare(b.name));
			this.upload = { file: null, preview: null, name: '', mapping: { id: '', x: '', y: '', z: '', group: '' }, busy: false, problem: '' };
			this.notice = `${mesh.name}: ${mesh.elements.toLocaleString('en')} elements stored. Choose it as a recipe's targets under Simulations → New recipe.`;
		} catch (err) {
			u.problem = err instanceof RequestFailed ? err.message : (err as Error).message;
		} finally {
			u.busy = false;
		}
	}

	async deleteMesh(id: string): Promise<void> {
		try {
			await this.api.deleteMesh(id);
			this.meshes = this.meshes.filter((m) => m.id !== id);
		} catch (err) {
			this.problem = (err as Error).message;
		}
	}

	async refreshTransfers(): Promise<void> {
		[this.tables, this.sets] = await Promise.all([this.api.transferTables(), this.api.transferSets()]);
	}
}
