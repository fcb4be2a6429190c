import type { CommentView, ProjectApi, VariogramView } from '$lib/api';
import type { Notices } from './notices.svelte';

type SaveInput = Parameters<ProjectApi['saveVariogram']>[1];

/**
 * The saved versions of the domain's variograms and their comment threads: saving a new version, restoring an
 * old one as the newest, reading and writing comments. What a version holds is put into the workspace by `onload`.
 */
export class VariogramHistory {
	/** Every saved version of the domain, newest first. */
	versions = $state<VariogramView[]>([]);
	/** The version whose comments are shown, and its thread (oldest first). */
	openThread = $state<string | null>(null);
	thread = $state<CommentView[]>([]);
	commentBody = $state('');
	saveName = $state('');
	saveNote = $state('');
	private domainId = '';

	constructor(
		private readonly api: ProjectApi,
		private readonly notices: Notices,
		private readonly onload: (v: VariogramView) => void
	) {}

	/** A newly chosen domain: its versions (already fetched), the save name defaulting to the domain's name. */
	reset(domainId: string, versions: VariogramView[], domainName: string): void {
		this.domainId = domainId;
		this.versions = versions;
		this.saveName = domainName;
		this.openThread = null;
	}

	/** Clears the thread while another domain loads. */
	close(): void {
		this.openThread = null;
	}

	async refresh(): Promise<void> {
		this.versions = await this.api.variograms(this.domainId);
	}

	/** Saves the model as the next version of `saveName`. */
	async save(input: Omit<SaveInput, 'name' | 'note'>): Promise<void> {
		this.notices.problem = '';
		try {
			const v = await this.api.saveVariogram(this.domainId, { ...input, name: this.saveName, note: this.saveNote });
			this.notices.status = `Saved as ${v.name} v${v.version}.`;
			this.saveNote = '';
			await this.refresh();
		} catch (err) {
			this.notices.problem = `Not saved: ${(err as Error).message}`;
		}
	}

	/** Saves an old version's parameters again as the newest version of its name, and loads it. */
	async restore(v: VariogramView): Promise<void> {
		try {
			const restored = await this.api.restoreVariogram(this.domainId, v.id);
			await this.refresh();
			this.onload(restored);
			this.notices.status = `Restored v${v.version} as ${restored.name} v${restored.version}.`;
		} catch (err) {
			this.notices.problem = `Not restored: ${(err as Error).message}`;
		}
	}

	/** Loads a version's settings and model into the workspace. */
	load(v: VariogramView): void {
		this.onload(v);
	}

	async toggleThread(v: VariogramView): Promise<void> {
		if (this.openThread === v.id) {
			this.openThread = null;
			return;
		}
		this.openThread = v.id;
		try {
			this.thread = await this.api.comments(this.domainId, v.id);
		} catch (err) {
			this.notices.problem = `Comments not loaded: ${(err as Error).message}`;
		}
	}

	async postComment(): Promise<void> {
		const id = this.openThread;
		if (!id) return;
		try {
			await this.api.addComment(this.domainId, id, this.commentBody);
			this.commentBody = '';
			this.thread = await this.api.comments(this.domainId, id);
			await this.refresh();
		} catch (err) {
			this.notices.problem = `Comment not posted: ${(err as Error).message}`;
		}
	}
}
