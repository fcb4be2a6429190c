import type { ProjectApi, RecipeSummaryView, RecipeView, SectionView, SoundingSummary } from '$lib/api';
import { isCurrentEngine } from '$lib/geostat';
import { RecipeReview } from './review.svelte';
import { EnsembleRun, type RunPool } from './run.svelte';
import { FieldViewer, type EnsembleEngine } from './viewer.svelte';
import { boundaryChoices, WeakZoneStudy, type BoundaryChoice } from './weak-zones.svelte';

/**
 * The Simulations page of a project: its recipes, the one opened (its view, the engine's recipe, a run in the
 * browser's worker pool, the viewer, its review and its weak-zone study), and the section's soundings and
 * contacts drawn over the field. Opening another recipe cancels the run of the one before; realizations live in
 * memory only.
 */
export class SimulationsPage {
	recipes = $state<RecipeSummaryView[]>([]);
	selectedId = $state('');
	view = $state.raw<RecipeView | null>(null);
	run = $state.raw<EnsembleRun | null>(null);
	viewer = $state.raw<FieldViewer | null>(null);
	review = $state.raw<RecipeReview | null>(null);
	weak = $state.raw<WeakZoneStudy | null>(null);
	section = $state.raw<SectionView | null>(null);
	soundings = $state.raw<SoundingSummary[]>([]);
	loading = $state(true);
	opening = $state(false);
	problem = $state('');

	private engine: EnsembleEngine | null = null;
	private opened = 0;
	private boundaries: BoundaryChoice[] = [];

	constructor(
		private readonly api: ProjectApi,
		private readonly lengthUnit: 'm' | 'ft',
		private readonly startPool: () => RunPool,
		private readonly startEngine: () => EnsembleEngine,
		private readonly onSelect: (recipeId: string) => void = () => {}
	) {}

	/** Loads the recipes and the section; opens `wanted` when it is one of them, else the newest. */
	async start(wanted: string | null): Promise<void> {
		try {
			const [recipes, soundings, boundaries, units] = await Promise.all([this.api.recipes(), this.api.soundings(), this.api.zoneBoundaries(), this.api.units()]);
			this.recipes = recipes;
			this.soundings = soundings;
			this.boundaries = boundaryChoices(boundaries, units, this.lengthUnit);
			const first = recipes.find((r) => r.id === wanted) ?? recipes[0];
			if (first) await this.open(first.id);
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.loading = false;
		}
	}

	async open(recipeId: string): Promise<void> {
		const ticket = ++this.opened;
		this.selectedId = recipeId;
		this.onSelect(recipeId);
		this.problem = '';
		this.opening = true;
		await this.close();
		try {
			const view = await this.api.recipe(recipeId);
			if (view.provenance.mesh) {
				// A mesh's realizations are for its model: regenerated on the server as files (Exports); the page
				// shows the recipe and does not pull a document of up to two million targets into the browser.
				if (ticket === this.opened) this.view = view;
				return;
			}
			const recipe = await this.api.recipeDocument(recipeId);
			const property = view.provenance.domains.find((d) => d.index !== null)?.property ?? 'qc1Ncs';
			const section = this.section ?? (await this.api.section(property));
			if (ticket !== this.opened) return;
			this.engine ??= this.startEngine();
			const run = new EnsembleRun(recipe, this.startPool);
			this.section = section;
			this.view = view;
			this.run = run;
			this.viewer = new FieldViewer(view, recipe, run, this.engine);
			this.review = new RecipeReview(this.api, recipeId, (changed) => this.changed(changed));
			this.weak = new WeakZoneStudy(this.api, [recipeId], this.viewer.properties, this.boundaries, this.lengthUnit, { [recipeId]: view.provenance.percentiles });
			void this.review.load();
			// A recipe opened is usually run next: its workers start and compile the engine meanwhile.
			if (recipe.kind !== 'uniform' && isCurrentEngine(recipe)) run.warm();
		} catch (err) {
			if (ticket === this.opened) this.problem = (err as Error).message;
		} finally {
			if (ticket === this.opened) this.opening = false;
		}
	}

	/** A recipe changed on the server (review asked, approved): its view and its entry in the list follow. */
	private changed(view: RecipeView): void {
		if (this.view?.id === view.id) this.view = view;
		this.recipes = this.recipes.map((r) => (r.id === view.id ? { ...r, status: view.status } : r));
	}

	/** Deletes a recipe (analyst) and opens the next one. */
	async remove(recipeId: string): Promise<void> {
		try {
			await this.api.deleteRecipe(recipeId);
			this.recipes = this.recipes.filter((r) => r.id !== recipeId);
			if (this.selectedId === recipeId) {
				await this.close();
				this.view = null;
				this.selectedId = '';
				if (this.recipes[0]) await this.open(this.recipes[0].id);
			}
		} catch (err) {
			this.problem = (err as Error).message;
		}
	}

	private async close(): Promise<void> {
		const run = this.run;
		this.run = null;
		this.viewer = null;
		this.review = null;
		this.weak = null;
		await run?.destroy();
	}

	async destroy(): Promise<void> {
		await this.close();
		this.engine?.terminate();
		this.engine = null;
	}
}
