import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { getDb, type Db } from '$lib/server/db';
import { auditLog, memberships, users } from '$lib/server/db/schema';
import { contacts, soundings, units } from '$lib/server/db/site-schema';
import { inTransaction } from '$lib/server/db/transaction';
import { closeMail } from '$lib/server/mail';
import { stopRealizations } from '$lib/server/realizations';
import { asActor, auditCsv, auditPeople, listAudit, recordAudit, recordExportDownload } from '$lib/server/services/audit';
import { editContacts, listContacts } from '$lib/server/services/contacts';
import { seedDemo } from '$lib/server/services/demo';
import { importSoundings } from '$lib/server/services/import';
import { changeMemberRole, removeMember } from '$lib/server/services/members';
import { updateProject } from '$lib/server/services/projects';
import { createRecipe, deleteRecipe } from '$lib/server/services/recipes';
import { deleteSounding } from '$lib/server/services/soundings';
import { changeSite, createUnit, createZoneBoundary, deleteUnit, deleteZoneBoundary, updateUnit, updateZoneBoundary } from '$lib/server/services/stratigraphy';
import { listVariograms, restoreVariogram, saveVariogram } from '$lib/server/services/variograms';
import { createDomain, createZonation, deleteDomain, deleteZonation, listZonations, updateDomain, updateZonation } from '$lib/server/services/zonations';
import { projects } from '$lib/server/db/schema';
import { ServiceError } from '$lib/server/errors';

let db: Db;
let projectId: string;
const ids: Record<'owner' | 'analyst' | 'reviewer' | 'viewer', string> = { owner: '', analyst: '', reviewer: '', viewer: '' };

const newest = () => listAudit(projectId, { limit: 1 }, db)[0];
const count = () => db.select().from(auditLog).where(eq(auditLog.projectId, projectId)).all().length;

beforeAll(async () => {
	process.env.DATABASE_URL = ':memory:';
	delete process.env.SMTP_URL;
	db = getDb();
	projectId = (await seedDemo(db))!;
	for (const role of Object.keys(ids) as (keyof typeof ids)[]) {
		ids[role] = db.select({ id: users.id }).from(users).where(eq(users.email, `${role}@conefield.test`)).get()!.id;
	}
}, 120_000);
afterAll(async () => {
	await stopRealizations();
	await closeMail();
});

describe('recordAudit(tx, entry)', () => {
	it('the demo’s seeding is in the log, by the owner (soundings, stratigraphy) and the analyst (variograms, recipes)', () => {
		const all = listAudit(projectId, { limit: 1000 }, db);
		const by = (kind: string) => new Set(all.filter((e) => e.kind === kind).map((e) => e.user?.name));
		expect(by('sounding')).toEqual(new Set(['Olu Owner']));
		expect(by('unit')).toEqual(new Set(['Olu Owner']));
		expect(by('variogram')).toEqual(new Set(['Ana Analyst']));
		expect(by('recipe')).toEqual(new Set(['Ana Analyst']));
		expect(all.find((e) => e.kind === 'sounding')!.detail).toMatch(/^1 sounding: imported LV-\d\d$/);
	});

	it('recordAudit names the person the work runs for (asActor), an explicit userId before it, and keeps their name if the account goes', () => {
		asActor(ids.viewer, () => recordAudit(db, { projectId, kind: 'export', action: 'downloaded', subject: 'Test' }));
		expect(newest().user).toEqual({ id: ids.viewer, name: 'Vera Viewer' });
		asActor(ids.viewer, () => recordExportDownload({ projectId, recipe: { id: null, name: 'Split', hash: 'ab12' }, file: 'Split_r0.csv', userId: ids.reviewer }, db));
		expect([newest().user?.name, newest().kind, newest().action, newest().subject, newest().detail]).toEqual(['Rui Reviewer', 'export', 'downloaded', 'Split', 'Split_r0.csv; SHA-256 ab12']);
		recordAudit(db, { projectId, kind: 'export', action: 'downloaded', subject: 'Nobody' });
		expect(newest().user).toBeNull();
		const temp = db.insert(users).values({ email: 'temp@conefield.test', name: 'Tem Porary' }).returning().get();
		recordAudit(db, { projectId, kind: 'export', action: 'downloaded', subject: 'Gone', userId: temp.id });
		db.delete(users).where(eq(users.id, temp.id)).run();
		expect(newest().user).toEqual({ id: null, name: 'Tem Porary' });
	});
});

describe('every kind of change is logged with the change', () => {
	const expectEntry = (kind: string, action: string, subject: RegExp | string, detail?: RegExp) => {
		const e = newest();
		expect([e.kind, e.action]).toEqual([kind, action]);
		expect(e.subject).toMatch(subject);
		if (detail) expect(e.detail).toMatch(detail);
		expect(e.user?.name).toBe('Ana Analyst');
	};
	const asAnalyst = <T>(fn: () => T) => asActor(ids.analyst, fn);

	it('units: created, changed (with what changed), deleted', () => {
		const u = asAnalyst(() => createUnit(projectId, { name: 'Fill', property: 'qc1Ncs', position: 0 }, db));
		expectEntry('unit', 'created', 'Fill', /qc1Ncs, position 1/);
		asAnalyst(() => updateUnit(projectId, u.id, { nkt: 16 }, db));
		expectEntry('unit', 'changed', 'Fill', /nkt: 14 → 16/);
		asAnalyst(() => deleteUnit(projectId, u.id, db));
		expectEntry('unit', 'deleted', 'Fill');
	});

	it('zone boundaries: created, moved, deleted; site settings changed', () => {
		const unit = db.select().from(units).where(eq(units.projectId, projectId)).all().find((u) => u.name.startsWith('Dense'))!;
		const b = asAnalyst(() => createZoneBoundary(projectId, { unitId: unit.id, chainageTop: 100, elevationTop: 0, chainageBottom: 100, elevationBottom: -12 }, db));
		expectEntry('zone-boundary', 'created', /boundary$/, /\(100, 0\) to \(100, -12\)/);
		asAnalyst(() => updateZoneBoundary(projectId, b.id, { unitId: unit.id, chainageTop: 110, elevationTop: 0, chainageBottom: 110, elevationBottom: -12 }, db));
		expectEntry('zone-boundary', 'moved', /boundary$/, /→ \(110, 0\)/);
		asAnalyst(() => deleteZoneBoundary(projectId, b.id, db));
		expectEntry('zone-boundary', 'deleted', /boundary$/);
		asAnalyst(() => changeSite(projectId, { groundwaterElevation: 1.5 }, db));
		expectEntry('site', 'changed', 'Site settings', /groundwaterElevation: .* → 1.5/);
	});

	it('contacts: an edit names the tops set and removed', () => {
		const c = listContacts(projectId, db).find((x) => !x.interpolated)!;
		asAnalyst(() => editContacts(projectId, { set: [{ soundingId: c.soundingId, unitId: c.unitId, topElevation: c.topElevation - 0.1 }], remove: [], interpolate: [] }, db));
		expectEntry('contact', 'changed', /^Contacts at LV-\d\d$/, /^set .* at LV-\d\d = /);
	});

	it('zonations and domains: created, changed, rules changed, deleted', () => {
		const unit = db.select().from(units).where(eq(units.projectId, projectId)).all().find((u) => u.name.startsWith('Dense'))!;
		const z = asAnalyst(() => createZonation(projectId, { name: 'Audit zonation', description: '', domains: [] }, db));
		expectEntry('zonation', 'created', 'Audit zonation', /no domains yet/);
		asAnalyst(() => updateZonation(projectId, z.id, { description: 'For the log' }, db));
		expectEntry('zonation', 'changed', 'Audit zonation', /description: "" → "For the log"/);
		const d = asAnalyst(() => createDomain(projectId, z.id, { name: 'Dense', property: 'qc1Ncs', members: [{ unitId: unit.id, zone: -1 }] }, db));
		expectEntry('domain', 'created', 'Dense (Audit zonation)');
		asAnalyst(() => updateDomain(projectId, d.id, { rules: { ...d.rules, minDepth: 2 } }, db));
		expectEntry('domain', 'changed rules of', 'Dense (Audit zonation)', /rule minDepth: 0 → 2/);
		asAnalyst(() => deleteDomain(projectId, d.id, db));
		expectEntry('domain', 'deleted', 'Dense (Audit zonation)');
		asAnalyst(() => deleteZonation(projectId, z.id, db));
		expectEntry('zonation', 'deleted', 'Audit zonation');
	});

	it('variograms: saved and restored, with the version', () => {
		const z = listZonations(projectId, db)[0];
		const v = listVariograms(projectId, z.domains[0].id, db)[0];
		const saved = saveVariogram(projectId, z.domains[0].id, ids.analyst, { name: v.name, model: v.model, settings: v.settings, misfit: v.misfit, note: 'again' }, db);
		expectEntry('variogram', 'saved', `${v.name} v${saved.version} (${z.domains[0].name})`);
		restoreVariogram(projectId, z.domains[0].id, v.id, ids.analyst, undefined, db);
		expectEntry('variogram', `restored version ${v.version} of`, `${v.name} v${saved.version + 1} (${z.domains[0].name})`);
	});

	it('recipes: created (with the hash) and deleted', () => {
		const z = listZonations(projectId, db)[0];
		const { recipe } = createRecipe(
			projectId,
			ids.analyst,
			{
				kind: 'uniform',
				name: 'Audit baseline',
				zonationId: z.id,
				percentiles: [50],
				grid: { geometry: '2d', chainage: { from: 0, to: 400, cell: 20 }, elevation: { from: -12, to: 5, cell: 1 } },
				domains: z.domains.map((d) => ({ domainId: d.id, simulate: true }))
			},
			db
		);
		expectEntry('recipe', 'created', 'Audit baseline', new RegExp(`uniform, P50; SHA-256 ${recipe.hash}`));
		asAnalyst(() => deleteRecipe(projectId, recipe.id, db));
		expectEntry('recipe', 'deleted', 'Audit baseline');
	});

	it('soundings: an upload names its file and soundings; a deletion names the sounding', () => {
		const text = ['depth,qc,fs,u2', '0.5,2000,20,5', '1.0,2500,25,8', '1.5,2600,30,9'].join('\n');
		const result = importSoundings(
			projectId,
			ids.analyst,
			{
				files: [{ name: 'AUDIT-01.csv', bytes: new TextEncoder().encode(text) }],
				mapping: { defaultId: 'AUDIT-01', depth: 'depth', qc: 'qc', fs: 'fs', u2: 'u2', units: { depth: 'm', qc: 'kPa', fs: 'kPa', u2: 'kPa' }, chainage: { value: 50 }, groundElevation: { value: 3 } }
			},
			db
		);
		expectEntry('sounding', 'uploaded', 'AUDIT-01.csv', /^1 sounding: imported AUDIT-01$/);
		asAnalyst(() => deleteSounding(projectId, result.files[0].soundings[0].id, db));
		expectEntry('sounding', 'deleted', 'AUDIT-01');
	});

	it('members and project settings: role changed, removed; the project renamed', () => {
		const extra = db.insert(users).values({ email: 'extra@conefield.test', name: 'Ex Tra' }).returning().get();
		db.insert(memberships).values({ projectId, userId: extra.id, role: 'viewer' }).run();
		asAnalyst(() => changeMemberRole(projectId, extra.id, 'reviewer'));
		expectEntry('member', 'changed the role of', 'extra@conefield.test', /viewer → reviewer/);
		asAnalyst(() => removeMember(projectId, extra.id));
		expectEntry('member', 'removed', 'extra@conefield.test', /was reviewer/);
		const project = db.select().from(projects).where(eq(projects.id, projectId)).get()!;
		asAnalyst(() => updateProject(project, 'owner', { description: 'Changed for the log.' }));
		expectEntry('site', 'changed', 'Project settings', /description: .* → "Changed for the log."/);
	});
});

describe('an entry is rolled back with a failed change', () => {
	it('a contacts edit that fails part-way (a contact to remove that does not exist) leaves neither the changes nor an entry', () => {
		const [a] = listContacts(projectId, db).filter((x) => !x.interpolated);
		const before = count();
		const missing = db.select({ id: soundings.id }).from(soundings).where(eq(soundings.projectId, projectId)).all().find((s) => s.id !== a.soundingId)!;
		const unitWithout = db.select().from(units).where(eq(units.projectId, projectId)).all().find((u) => !listContacts(projectId, db).some((c) => c.soundingId === missing.id && c.unitId === u.id))!;
		expect(() =>
			asActor(ids.analyst, () =>
				editContacts(projectId, { set: [{ soundingId: a.soundingId, unitId: a.unitId, topElevation: a.topElevation - 0.5 }], remove: [{ soundingId: missing.id, unitId: unitWithout.id }], interpolate: [] }, db)
			)
		).toThrow(ServiceError);
		expect(count()).toBe(before);
		const still = db.select().from(contacts).where(eq(contacts.soundingId, a.soundingId)).all().find((c) => c.unitId === a.unitId)!;
		expect(still.topElevation).toBe(a.topElevation);
	});

	it('a change inside a transaction that fails afterwards is rolled back with its entry', () => {
		const before = count();
		expect(() =>
			inTransaction(db, (tx) => {
				asActor(ids.analyst, () => createUnit(projectId, { name: 'Rolled back', property: 'qc1Ncs' }, tx));
				expect(listAudit(projectId, { limit: 1 }, tx)[0].subject).toBe('Rolled back');
				throw new Error('later step failed');
			})
		).toThrow('later step failed');
		expect(count()).toBe(before);
		expect(db.select().from(units).where(eq(units.name, 'Rolled back')).all()).toHaveLength(0);
	});
});

describe('listAudit / auditPeople / auditCsv', () => {
	it('listAudit filters by kind and by person, newest first, and pages back with `before`', () => {
		const recipes = listAudit(projectId, { kind: 'recipe', limit: 1000 }, db);
		expect(recipes.length).toBeGreaterThan(2);
		expect(recipes.every((e) => e.kind === 'recipe')).toBe(true);
		expect(recipes.map((e) => e.id)).toEqual([...recipes.map((e) => e.id)].sort((a, b) => b - a));
		const owner = listAudit(projectId, { userId: ids.owner, limit: 1000 }, db);
		expect(owner.length).toBeGreaterThan(0);
		expect(owner.every((e) => e.user?.id === ids.owner)).toBe(true);
		const page = listAudit(projectId, { limit: 3 }, db);
		const next = listAudit(projectId, { limit: 3, before: page[2].id }, db);
		expect(next[0].id).toBeLessThan(page[2].id);
		expect(auditPeople(projectId, db).map((p) => p.name)).toEqual(expect.arrayContaining(['Ana Analyst', 'Olu Owner']));
	});

	it('auditCsv writes RFC 4180 with a header, quotes commas, and defuses text a spreadsheet would run as a formula', () => {
		recordAudit(db, { projectId, kind: 'export', action: 'downloaded', subject: '=HYPERLINK("x")', detail: 'a, b', userId: ids.viewer });
		const csv = [...auditCsv(projectId, { kind: 'export' }, db)].join('');
		const lines = csv.split('\r\n');
		expect(lines[0]).toBe('time (UTC),person,kind,action,subject,detail');
		expect(lines[1]).toMatch(/^\d{4}-\d\d-\d\dT[\d:.]+Z,Vera Viewer,Exports,downloaded,"'=HYPERLINK\(""x""\)","a, b"$/);
	});
});
