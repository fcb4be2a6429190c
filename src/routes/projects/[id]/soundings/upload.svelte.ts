// The upload panel's state: chosen files, their column mappings, the server's plan of the upload (dry run),
// the user's choices for clashing names and GEOL contacts, and the import itself.
import { detectFormat, type DelimitedPreview } from '$lib/cpt';
import type { SimulatedProperty } from '$lib/properties';
import type { ImportResult, UploadPlan } from '$lib/server/services/import';
import type { PlannedSounding } from '$lib/server/services/import-plan';
import { formFromGuess, mappingOf, mappingProblems, type MappingForm } from './mapping';

export interface Problem {
	file: string;
	code: string;
	message: string;
	line?: number;
	column?: string;
}

export interface Entry {
	file: File;
	format: 'gef' | 'ags4' | 'delimited';
	preview: DelimitedPreview | null;
	form: MappingForm | null;
	error: string | null;
}

/** The choice for one clash: skip, replace, or keep both under `name`. */
export interface ClashChoice {
	action: 'skip' | 'replace' | 'rename' | '';
	name: string;
}

/** The choice for one GEOL key: the unit it becomes (blank: left out) and a new unit's property. */
export interface GeologyChoice {
	key: string;
	unit: string;
	property: SimulatedProperty;
}

export const MAX_FILE_MB = 50;

const clashKey = (s: Pick<PlannedSounding, 'file' | 'name'>) => `${s.file}\u0000${s.name}`;

export class UploadState {
	entries = $state<Entry[]>([]);
	busy = $state(false);
	/** The refusal of the last check or import: the message and each file's problem. */
	refused = $state<{ message: string; files: Problem[] } | null>(null);
	groundFallback = $state<number | null>(null);
	areaFallback = $state<number | null>(null);
	/** The plan of the current files and choices; null until checked, and again after any change. */
	plan = $state<UploadPlan | null>(null);
	choices = $state<Record<string, ClashChoice>>({});
	importGeology = $state(true);
	geology = $state<GeologyChoice[]>([]);

	constructor(readonly projectId: string) {}

	readonly pending = $derived(this.entries.some((e) => e.format === 'delimited' && !e.preview && !e.error));
	readonly incomplete = $derived(this.entries.some((e) => e.format === 'delimited' && (!e.form || mappingProblems(e.form).length > 0)));
	readonly unreadable = $derived(this.entries.some((e) => e.error));
	readonly needsFallbacks = $derived(this.entries.some((e) => e.format !== 'delimited'));
	/** Clashes of the plan, each with the choice made for it. */
	readonly clashes = $derived((this.plan?.soundings ?? []).filter((s) => s.clash !== null));
	readonly undecided = $derived(this.clashes.filter((s) => !this.choices[clashKey(s)]?.action).length);
	/** The soundings that importing would store, with the current choices (the plan may predate them). */
	readonly stored = $derived.by(() => {
		const all = this.plan?.soundings ?? [];
		// A later file's "replace" of a name held earlier in the upload leaves the earlier one out.
		const displaced = new Set(
			this.clashes.filter((s) => s.clash!.with === 'upload' && this.choiceOf(s).action === 'replace').map((s) => `${s.clash!.otherFile}\u0000${s.name}`)
		);
		return all.filter((s) => {
			if (s.clash) return this.choiceOf(s).action !== '' && this.choiceOf(s).action !== 'skip';
			return s.action !== 'skip' && !displaced.has(clashKey(s));
		});
	});

	/** The choice for a clash of the current plan (setPlan makes one for each). */
	choiceOf(s: PlannedSounding): ClashChoice {
		return this.choices[clashKey(s)] ?? { action: '', name: s.clash?.suggestedName ?? s.name };
	}

	/** Sets every clash to one action (names keep their suggestions). */
	chooseAll(action: ClashChoice['action']): void {
		for (const s of this.clashes) this.choiceOf(s).action = action;
	}

	/** Any change of files, mappings or fallbacks makes the plan stale. */
	invalidate(): void {
		this.plan = null;
		this.refused = null;
	}

	async choose(list: FileList | File[] | null): Promise<void> {
		this.invalidate();
		for (const file of Array.from(list ?? [])) {
			if (this.entries.some((e) => e.file.name === file.name && e.file.size === file.size)) continue;
			const head = await file.slice(0, 256).text();
			this.entries.push({ file, format: detectFormat(head, file.name), preview: null, form: null, error: null });
		}
		for (const e of this.entries) if (e.format === 'delimited' && !e.preview && !e.error) void this.loadPreview(e);
	}

	remove(e: Entry): void {
		this.entries = this.entries.filter((x) => x !== e);
		this.invalidate();
	}

	/** Drops the files the plan found already imported. */
	removeAlreadyImported(): void {
		const names = new Set((this.plan?.problems ?? []).filter((p) => p.code === 'already-imported').map((p) => p.file));
		this.entries = this.entries.filter((e) => !names.has(e.file.name));
		this.invalidate();
	}

	private async loadPreview(e: Entry): Promise<void> {
		if (e.file.size > MAX_FILE_MB * 1024 * 1024) {
			e.error = `${e.file.name}: file is ${(e.file.size / 1024 / 1024).toFixed(1)} MB, over the ${MAX_FILE_MB} MB limit`;
			return;
		}
		const body = new FormData();
		body.append('file', e.file);
		const res = await fetch(`/api/v1/projects/${this.projectId}/soundings/preview?rows=8`, { method: 'POST', body });
		const json = await res.json().catch(() => null);
		const entry = this.entries.find((x) => x.file === e.file);
		if (!entry) return;
		if (!res.ok) {
			entry.error = json?.error?.files?.[0]?.message ?? json?.error?.message ?? `The preview failed (${res.status}).`;
			return;
		}
		entry.preview = json.preview;
		entry.form = formFromGuess(json.preview, e.file.name);
	}

	/** Asks the server what the upload would do (nothing is written). */
	async check(): Promise<void> {
		const res = await this.send(true);
		if (!res) return;
		if (res.status === 200) {
			this.setPlan((res.json as { plan: UploadPlan }).plan);
			return;
		}
		this.refuse(res.status, res.json);
	}

	/** Imports the upload as planned; returns what was imported, or null when it was refused. */
	async confirm(): Promise<ImportResult | null> {
		const res = await this.send(false);
		if (!res) return null;
		if (res.status === 201) {
			this.entries = [];
			this.plan = null;
			return res.json as ImportResult;
		}
		const plan = (res.json as { error?: { plan?: UploadPlan } })?.error?.plan;
		if (plan) this.setPlan(plan);
		this.refuse(res.status, res.json);
		return null;
	}

	private setPlan(plan: UploadPlan): void {
		this.plan = plan;
		this.refused = null;
		for (const s of plan.soundings) {
			if (s.clash && !this.choices[clashKey(s)]) this.choices[clashKey(s)] = { action: '', name: s.clash.suggestedName };
		}
		const known = new Map(this.geology.map((g) => [g.key, g]));
		this.geology = (plan.geology?.keys ?? []).map((k) => known.get(k.key) ?? { key: k.key, unit: k.suggestedUnit, property: k.suggestedProperty });
	}

	private refuse(status: number, json: unknown): void {
		const error = (json as { error?: { message?: string; files?: Problem[]; issues?: { message: string }[] } } | null)?.error;
		this.refused = {
			message: error?.message ?? `The upload failed (${status}).`,
			files: error?.files ?? (error?.issues ?? []).map((i) => ({ file: '', code: '', message: i.message }))
		};
	}

	private options(dryRun: boolean): Record<string, unknown> {
		const mappings: Record<string, unknown> = {};
		for (const e of this.entries) if (e.format === 'delimited' && e.form && e.preview) mappings[e.file.name] = mappingOf(e.form, e.preview);
		const defaults: Record<string, number> = {};
		if (this.groundFallback !== null && Number.isFinite(this.groundFallback)) defaults.groundElevation = this.groundFallback;
		if (this.areaFallback !== null && Number.isFinite(this.areaFallback)) defaults.areaRatio = this.areaFallback;
		const clashes = this.clashes
			.map((s) => ({ s, c: this.choiceOf(s) }))
			.filter(({ c }) => c.action !== '')
			.map(({ s, c }) => ({ file: s.file, sounding: s.name, action: c.action, ...(c.action === 'rename' && c.name.trim() ? { name: c.name.trim() } : {}) }));
		const geology =
			this.plan?.geology && this.importGeology
				? { units: this.geology.map((g) => ({ key: g.key, unit: g.unit.trim() || null, property: g.property })) }
				: undefined;
		return { dryRun, mappings, ...(Object.keys(defaults).length ? { defaults } : {}), ...(clashes.length ? { clashes } : {}), ...(geology ? { geology } : {}) };
	}

	private async send(dryRun: boolean): Promise<{ status: number; json: unknown } | null> {
		this.busy = true;
		try {
			const body = new FormData();
			for (const e of this.entries) body.append('files', e.file);
			body.append('options', JSON.stringify(this.options(dryRun)));
			const res = await fetch(`/api/v1/projects/${this.projectId}/soundings`, { method: 'POST', body });
			return { status: res.status, json: await res.json().catch(() => null) };
		} catch {
			this.refused = { message: 'The upload did not reach the server; check the connection and try again.', files: [] };
			return null;
		} finally {
			this.busy = false;
		}
	}
}

/** The soundings page's notice after an import: what was stored, replaced, renamed and skipped, and the notes. */
export function importSummary(result: ImportResult): { text: string; notes: string[] } {
	const stored = result.files.flatMap((f) => f.soundings);
	const plural = (n: number, one: string) => `${n} ${n === 1 ? one : `${one}s`}`;
	const parts = [`Imported ${plural(stored.length, 'sounding')}: ${stored.map((s) => s.name).join(', ')}.`];
	const replaced = stored.filter((s) => s.action === 'replace');
	const renamed = stored.filter((s) => s.action === 'rename');
	const skipped = result.files.flatMap((f) => f.skipped);
	if (replaced.length) parts.push(`Replaced the readings of ${replaced.map((s) => s.name).join(', ')} (contacts kept).`);
	if (renamed.length) parts.push(`Kept both: ${renamed.map((s) => `${s.originalName} as ${s.name}`).join(', ')}.`);
	if (skipped.length) parts.push(`Skipped ${skipped.join(', ')}.`);
	if (result.geology) {
		const created = result.geology.unitsCreated;
		parts.push(`Wrote ${plural(result.geology.contacts, 'contact')} from the GEOL log${created.length ? `; new units: ${created.join(', ')}` : ''}.`);
	}
	if (result.interpolatedContacts > 0) {
		const n = result.interpolatedContacts;
		parts.push(
			`${plural(n, 'sounding')} without contacts of ${n === 1 ? 'its' : 'their'} own took contacts interpolated from ${n === 1 ? 'its' : 'their'} neighbours along chainage; review them on the Stratigraphy page.`
		);
	}
	return { text: parts.join(' '), notes: stored.flatMap((s) => s.notes.map((n) => `${s.name}: ${n}`)) };
}
