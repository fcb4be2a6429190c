import type { Notified, ProjectApi, RecipeNoteView, RecipeView } from '$lib/api';

/**
 * A recipe's review: its thread (comments, review requests, the approval) and the three steps — ask the
 * project's reviewers (analyst), comment (reviewer; the author is e-mailed), approve with a comment (a reviewer
 * other than the author; the recipe is then frozen). Each step reports whom it e-mailed.
 */
export class RecipeReview {
	notes = $state.raw<RecipeNoteView[]>([]);
	draft = $state('');
	busy = $state(false);
	problem = $state('');
	/** What the last step did, in words ("Sent to …"). */
	message = $state('');

	constructor(
		private readonly api: ProjectApi,
		readonly recipeId: string,
		private readonly onChanged: (view: RecipeView) => void
	) {}

	async load(): Promise<void> {
		try {
			this.notes = await this.api.recipeNotes(this.recipeId);
		} catch (err) {
			this.problem = (err as Error).message;
		}
	}

	/** Asks the project's reviewers to review the recipe, with the draft as a note. */
	ask(): Promise<void> {
		return this.step(async () => {
			const r = await this.api.requestReview(this.recipeId, this.draft.trim());
			this.onChanged(r.recipe);
			return { r, done: 'Review asked' };
		});
	}

	/** Comments with the draft. */
	comment(): Promise<void> {
		return this.step(async () => ({ r: await this.api.commentOnRecipe(this.recipeId, this.draft.trim()), done: 'Comment added' }));
	}

	/** Approves the recipe with the draft as the approval's comment. */
	approve(): Promise<void> {
		return this.step(async () => {
			const r = await this.api.approveRecipe(this.recipeId, this.draft.trim());
			this.onChanged(r.recipe);
			return { r, done: 'Approved' };
		});
	}

	private async step(run: () => Promise<{ r: Notified; done: string }>): Promise<void> {
		this.busy = true;
		this.problem = '';
		this.message = '';
		try {
			const { r, done } = await run();
			this.draft = '';
			const to = r.notified.length ? `; e-mailed ${r.notified.join(', ')}` : '; nobody to e-mail';
			const failed = r.failed.length ? ` (the e-mail to ${r.failed.join(', ')} could not be sent)` : '';
			this.message = `${done}${to}${failed}.`;
			this.notes = await this.api.recipeNotes(this.recipeId);
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.busy = false;
		}
	}
}
