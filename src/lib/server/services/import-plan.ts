import { and, count, eq, inArray } from 'drizzle-orm';
import type { ParsedSounding } from '$lib/cpt';
import { contacts, soundings, sourceFiles, type SourceFormat } from '$lib/server/db/site-schema';
import type { DbOrTx } from '$lib/server/db/transaction';

/** What to do with a sounding whose name is already taken: in the project, or by another file of the upload. */
export type ClashAction = 'skip' | 'replace' | 'rename';

/** The user's choice for one clashing sounding, named by its file and its name in that file. */
export interface ClashResolution {
	file: string;
	sounding: string;
	action: ClashAction;
	/** The new name for 'rename'; default the suggested one. */
	name?: string;
}

/** The project's sounding a name clashes with. */
export interface ExistingSounding {
	id: string;
	name: string;
	readings: number;
	sourceFileId: string | null;
	sourceFile: string | null;
	contacts: number;
}

/** One sounding of an upload and what the import will do with it. */
export interface PlannedSounding {
	file: string;
	/** The name as the file gives it. */
	name: string;
	readings: number;
	maxDepth: number;
	/** 'import' when its name is free; otherwise the resolution chosen, or 'unresolved'. */
	action: 'import' | ClashAction | 'unresolved';
	/** The name it is stored under; null when skipped or unresolved. */
	finalName: string | null;
	clash: {
		with: 'project' | 'upload';
		/** The project's sounding of that name. */
		existing?: ExistingSounding;
		/** The file of this upload that also holds the name. */
		otherFile?: string;
		/** A free name for keeping both, e.g. "CPT-07 (2)". */
		suggestedName: string;
	} | null;
	/** What will happen, in words (for clashes), or why the choice cannot be carried out. */
	message: string | null;
	/** How the parser read something unusual (sign convention, fallback). */
	notes: string[];
}

/** The files of an upload as the planner needs them. */
export interface PlanInput {
	name: string;
	format: SourceFormat;
	soundings: ParsedSounding[];
}

/**
 * Decides, for every sounding of an upload, under which name it is stored, given the names already in the
 * project and the user's resolutions of clashes. A name is taken when the project holds a sounding of that
 * name or an earlier sounding of the upload is stored under it. A clash without a resolution is 'unresolved';
 * 'skip' leaves the sounding out; 'replace' stores it in place of the project's sounding (which keeps its id,
 * contacts and groundwater) or of the earlier one of the upload (which is then skipped); 'rename' stores it
 * under a free new name. Reads only.
 */
export function planSoundings(projectId: string, files: PlanInput[], resolutions: ClashResolution[] = [], db: DbOrTx): PlannedSounding[] {
	const projectNames = new Set(db.select({ name: soundings.name }).from(soundings).where(eq(soundings.projectId, projectId)).all().map((r) => r.name));
	const uploadNames = new Set(files.flatMap((f) => f.soundings.map((s) => s.id)));
	const existing = existingSoundings(projectId, [...uploadNames].filter((n) => projectNames.has(n)), db);
	const chosen = new Map(resolutions.map((r) => [key(r.file, r.sounding), r]));
	const suggested = new Set<string>();
	const suggest = (name: string): string => {
		for (let k = 2; ; k++) {
			const candidate = `${name} (${k})`;
			if (!projectNames.has(candidate) && !uploadNames.has(candidate) && !suggested.has(candidate)) {
				suggested.add(candidate);
				return candidate;
			}
		}
	};

	const plan: PlannedSounding[] = [];
	/** Final name → the planned sounding stored under it. */
	const holders = new Map<string, PlannedSounding>();
	const replacing = new Map<string, PlannedSounding>();
	for (const f of files) {
		for (const s of f.soundings) {
			const p: PlannedSounding = {
				file: f.name,
				name: s.id,
				readings: s.depth.length,
				maxDepth: maxOf(s.depth),
				action: 'import',
				finalName: s.id,
				clash: null,
				message: null,
				notes: s.notes ?? []
			};
			plan.push(p);
			const inProject = existing.get(s.id);
			const holder = holders.get(s.id);
			if (!inProject && !holder) {
				holders.set(s.id, p);
				continue;
			}
			p.clash = inProject
				? { with: 'project', existing: inProject, suggestedName: suggest(s.id) }
				: { with: 'upload', otherFile: holder!.file, suggestedName: suggest(s.id) };
			const r = chosen.get(key(f.name, s.id));
			const what = inProject
				? `sounding ${s.id} is already in the project (${inProject.readings} readings${inProject.sourceFile ? ` from ${inProject.sourceFile}` : ''}${inProject.contacts ? `, ${inProject.contacts} contacts` : ''})`
				: `sounding ${s.id} is also in ${holder!.file} of this upload`;
			if (!r) {
				unresolved(p, `${what}: skip it, replace, or keep both under a new name`);
			} else if (r.action === 'skip') {
				p.action = 'skip';
				p.finalName = null;
				p.message = `${what}; this one is skipped`;
			} else if (r.action === 'replace') {
				const earlier = holder ?? replacing.get(s.id);
				if (earlier) {
					earlier.action = 'skip';
					earlier.finalName = null;
					earlier.message = `replaced by ${s.id} from ${f.name}`;
				}
				p.action = 'replace';
				holders.set(s.id, p);
				if (inProject) replacing.set(s.id, p);
				p.message = inProject
					? `replaces the project's ${s.id} (${inProject.readings} readings); its id${inProject.contacts ? `, ${inProject.contacts} contacts` : ''} and groundwater are kept`
					: `replaces ${s.id} from ${holder!.file}, which is skipped`;
			} else {
				const name = (r.name ?? p.clash.suggestedName).trim();
				if (name === '' || projectNames.has(name) || holders.has(name) || (uploadNames.has(name) && name !== s.id)) {
					unresolved(p, `${what}; the new name ${name === '' ? '(empty)' : name} is taken too: choose another`);
				} else {
					p.action = 'rename';
					p.finalName = name;
					holders.set(name, p);
					p.message = `${what}; this one is stored as ${name}`;
				}
			}
		}
	}
	return plan;
}

function unresolved(p: PlannedSounding, message: string): void {
	p.action = 'unresolved';
	p.finalName = null;
	p.message = message;
}

function existingSoundings(projectId: string, names: string[], db: DbOrTx): Map<string, ExistingSounding> {
	const out = new Map<string, ExistingSounding>();
	if (names.length === 0) return out;
	const rows = db
		.select({ id: soundings.id, name: soundings.name, readings: soundings.readings, sourceFileId: soundings.sourceFileId, sourceFile: sourceFiles.name })
		.from(soundings)
		.leftJoin(sourceFiles, eq(sourceFiles.id, soundings.sourceFileId))
		.where(and(eq(soundings.projectId, projectId), inArray(soundings.name, names)))
		.all();
	const counts = new Map(
		db
			.select({ soundingId: contacts.soundingId, n: count() })
			.from(contacts)
			.where(inArray(contacts.soundingId, rows.map((r) => r.id)))
			.groupBy(contacts.soundingId)
			.all()
			.map((c) => [c.soundingId, c.n])
	);
	for (const r of rows) out.set(r.name, { ...r, contacts: counts.get(r.id) ?? 0 });
	return out;
}

function key(file: string, sounding: string): string {
	return `${file}\u0000${sounding}`;
}

function maxOf(values: ArrayLike<number>): number {
	let m = -Infinity;
	for (let i = 0; i < values.length; i++) if (values[i] > m) m = values[i];
	return m;
}
