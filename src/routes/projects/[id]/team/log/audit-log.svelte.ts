import type { AuditEntryView, ProjectApi } from '$lib/api';
import type { AuditKind } from '$lib/audit';

/** The project's audit log as the page shows it: filtered by kind and person, newest first, a page at a time. */
export class AuditLog {
	entries = $state.raw<AuditEntryView[]>([]);
	people = $state.raw<{ id: string; name: string }[]>([]);
	kind = $state<AuditKind | ''>('');
	user = $state('');
	next = $state<number | null>(null);
	loading = $state(false);
	problem = $state('');

	constructor(private readonly api: ProjectApi) {}

	/** The CSV download of every entry the filters keep. */
	get csvUrl(): string {
		return this.api.csv.audit({ kind: this.kind || null, user: this.user || null });
	}

	/** The newest page for the filters. */
	async load(): Promise<void> {
		await this.fetch(null);
	}

	/** The next page back in time. */
	async more(): Promise<void> {
		if (this.next !== null) await this.fetch(this.next);
	}

	private async fetch(before: number | null): Promise<void> {
		this.loading = true;
		this.problem = '';
		try {
			const page = await this.api.audit({ kind: this.kind || null, user: this.user || null, before });
			this.entries = before === null ? page.entries : [...this.entries, ...page.entries];
			this.next = page.next;
			this.people = page.people;
		} catch (err) {
			this.problem = (err as Error).message;
		} finally {
			this.loading = false;
		}
	}
}
