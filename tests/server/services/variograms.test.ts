import { beforeEach, describe, expect, it } from 'vitest';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { memberships, projects, users } from '../../../src/lib/server/db/schema';
import { domains, variograms, zonations } from '../../../src/lib/server/db/site-schema';
import { ServiceError } from '../../../src/lib/server/errors';
import {
	addComment,
	getVariogram,
	listComments,
	listVariograms,
	restoreVariogram,
	saveVariogram
} from '../../../src/lib/server/services/variograms';
import { readVariogramSettings, variogramSaveSchema, type VariogramSave } from '../../../src/lib/schemas/variogram';
import { variogramModelSchema as engineModelSchema } from '../../../src/lib/geostat/index';
import type { ProjectRole } from '../../../src/lib/server/db/schema';

// Creates the site tables from site-schema.ts when the migrations do not have them yet.
async function ensureSiteTables(db: Db): Promise<void> {
	const has = db.$client.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name = 'variograms'").get();
	if (has) return;
	const api = await import('drizzle-kit/api');
	const base = await import('../../../src/lib/server/db/schema');
	const site = await import('../../../src/lib/server/db/site-schema');
	const prev = await api.generateSQLiteDrizzleJson({ ...base });
	const next = await api.generateSQLiteDrizzleJson({ ...base, ...site });
	for (const statement of await api.generateSQLiteMigration(prev, next)) db.$client.exec(statement);
}

interface World {
	db: Db;
	projectId: string;
	domainId: string;
	otherProjectId: string;
	otherDomainId: string;
	user: Record<ProjectRole, string>;
}

async function world(): Promise<World> {
	const db = openDatabase(':memory:');
	await ensureSiteTables(db);
	const roles: ProjectRole[] = ['viewer', 'reviewer', 'analyst', 'owner'];
	const people = roles.map((r) => db.insert(users).values({ email: `${r}@example.test`, name: `The ${r}` }).returning().get());
	const project = db.insert(projects).values({ name: 'Levee', createdBy: people[3].id }).returning().get();
	const other = db.insert(projects).values({ name: 'Other', createdBy: people[3].id }).returning().get();
	roles.forEach((role, i) => db.insert(memberships).values({ projectId: project.id, userId: people[i].id, role }).run());
	const domainIn = (projectId: string) => {
		const z = db.insert(zonations).values({ projectId, name: 'By unit' }).returning().get();
		return db.insert(domains).values({ zonationId: z.id, name: 'Sand', property: 'qc1Ncs' }).returning().get().id;
	};
	const user = Object.fromEntries(roles.map((role, i) => [role, people[i].id])) as Record<ProjectRole, string>;
	return { db, projectId: project.id, domainId: domainIn(project.id), otherProjectId: other.id, otherDomainId: domainIn(other.id), user };
}

const input = (over: Partial<VariogramSave> = {}): VariogramSave =>
	variogramSaveSchema.parse({
		name: 'Sand, normal scores',
		model: {
			azimuth: 0,
			structures: [
				{ type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
				{ type: 'exponential', sill: 0.9, rangeMajor: 40, rangeMinor: 40, rangeVertical: 0.8 }
			]
		},
		settings: {
			transform: 'normal-score',
			declustered: true,
			vertical: { lag: 0.1, nLags: 20, lagTolerance: 0.05 },
			horizontal: { lag: 10, nLags: 12, lagTolerance: 5, verticalBand: 0.1, azimuth: null, angleTolerance: 22.5 },
			minPairs: 30
		},
		misfit: 12.5,
		...over
	});

function expectStatus(fn: () => unknown, status: number) {
	try {
		fn();
	} catch (err) {
		expect(err).toBeInstanceOf(ServiceError);
		expect((err as ServiceError).status).toBe(status);
		return;
	}
	expect.fail(`expected a ServiceError ${status}`);
}

// The service functions on the test's database.
let w: World;
const save = (p: string, d: string, userId: string, i: VariogramSave) => saveVariogram(p, d, userId, i, w.db);
const list = (p: string, d: string) => listVariograms(p, d, w.db);
const get = (p: string, d: string, v: string) => getVariogram(p, d, v, w.db);
const restore = (p: string, d: string, v: string, userId: string, note?: string) => restoreVariogram(p, d, v, userId, note, w.db);
const comments = (p: string, d: string, v: string) => listComments(p, d, v, w.db);
const comment = (p: string, d: string, v: string, userId: string, body: string) => addComment(p, d, v, userId, body, w.db);

describe('variograms service', () => {
	beforeEach(async () => {
		w = await world();
	});

	it('saveVariogram numbers versions per name from 1, and keeps who, model, settings and misfit', () => {
		const a1 = save(w.projectId, w.domainId, w.user.analyst, input());
		const a2 = save(w.projectId, w.domainId, w.user.owner, input({ misfit: 10 }));
		const b1 = save(w.projectId, w.domainId, w.user.analyst, input({ name: 'Sand, raw' }));
		expect([a1.version, a2.version, b1.version]).toEqual([1, 2, 1]);
		expect(a1.createdBy).toEqual({ id: w.user.analyst, name: 'The analyst' });
		expect(a2.createdBy!.name).toBe('The owner');
		expect(a1.model).toEqual(input().model);
		expect(a1.settings).toEqual(input().settings);
		expect(a1.misfit).toBe(12.5);
		expect(Date.parse(a1.createdAt)).toBeGreaterThan(0);
		const history = list(w.projectId, w.domainId);
		expect(history).toHaveLength(3);
		expect(new Set(history.map((v) => `${v.name}#${v.version}`))).toEqual(new Set(['Sand, normal scores#1', 'Sand, normal scores#2', 'Sand, raw#1']));
	});

	it('saveVariogram trims the name, so " Sand, raw " continues the versions of "Sand, raw"', () => {
		save(w.projectId, w.domainId, w.user.analyst, input({ name: 'Sand, raw' }));
		const v = save(w.projectId, w.domainId, w.user.analyst, variogramSaveSchema.parse({ ...input(), name: '  Sand, raw ' }));
		expect(v).toMatchObject({ name: 'Sand, raw', version: 2 });
	});

	it('restoreVariogram saves the old parameters as a new version; the old version is unchanged', () => {
		const v1 = save(w.projectId, w.domainId, w.user.analyst, input());
		const changed = input({ misfit: 3 });
		(changed.model.structures[1] as { rangeMajor: number }).rangeMajor = 80;
		const v2 = save(w.projectId, w.domainId, w.user.analyst, changed);
		const v3 = restore(w.projectId, w.domainId, v1.id, w.user.analyst);
		expect(v3.version).toBe(3);
		expect(v3.model).toEqual(v1.model);
		expect(v3.settings).toEqual(v1.settings);
		expect(v3.misfit).toBe(12.5);
		expect(v3.note).toBe('Restored from version 1.');
		expect(get(w.projectId, w.domainId, v2.id).model).toEqual(changed.model);
		expect(get(w.projectId, w.domainId, v1.id).version).toBe(1);
		const v4 = restore(w.projectId, w.domainId, v2.id, w.user.owner, 'Back to the long range');
		expect(v4).toMatchObject({ version: 4, note: 'Back to the long range' });
	});

	it('addComment by a reviewer is listed with its author, oldest first, and counted on the variogram', () => {
		const v = save(w.projectId, w.domainId, w.user.analyst, input());
		comment(w.projectId, w.domainId, v.id, w.user.reviewer, 'The horizontal range rests on three bins.');
		comment(w.projectId, w.domainId, v.id, w.user.analyst, 'Agreed; see the sensitivity.');
		const thread = comments(w.projectId, w.domainId, v.id);
		expect(thread.map((c) => [c.author!.name, c.body])).toEqual([
			['The reviewer', 'The horizontal range rests on three bins.'],
			['The analyst', 'Agreed; see the sensitivity.']
		]);
		expect(get(w.projectId, w.domainId, v.id).comments).toBe(2);
		expect(list(w.projectId, w.domainId)[0].comments).toBe(2);
	});

	it('rows saved under the old transform names read with the engine\'s: raw → none, normal → normal-score', () => {
		const stored = (transform: string, name: string) =>
			w.db
				.insert(variograms)
				.values({ domainId: w.domainId, name, version: 1, model: input().model, settings: { ...input().settings, transform }, createdBy: w.user.analyst })
				.returning()
				.get();
		const raw = stored('raw', 'Old raw');
		const normal = stored('normal', 'Old normal');
		expect(get(w.projectId, w.domainId, raw.id).settings.transform).toBe('none');
		expect(get(w.projectId, w.domainId, normal.id).settings.transform).toBe('normal-score');
		expect(list(w.projectId, w.domainId).map((v) => v.settings.transform).sort()).toEqual(['none', 'normal-score']);
		// Restoring an old row writes the engine's name.
		const again = restore(w.projectId, w.domainId, raw.id, w.user.analyst);
		expect(w.db.select().from(variograms).all().find((v) => v.id === again.id)!.settings).toMatchObject({ transform: 'none' });
	});

	it('a domain or variogram of another project answers 404', () => {
		const v = save(w.projectId, w.domainId, w.user.analyst, input());
		expectStatus(() => save(w.projectId, w.otherDomainId, w.user.analyst, input()), 404);
		expectStatus(() => list(w.otherProjectId, w.domainId), 404);
		expectStatus(() => get(w.projectId, w.domainId, 'no-such-id'), 404);
		expectStatus(() => get(w.otherProjectId, w.otherDomainId, v.id), 404);
		expectStatus(() => comments(w.projectId, w.domainId, 'no-such-id'), 404);
	});
});

describe('variogramSaveSchema', () => {
	it('variogramSaveSchema rejects an empty name, a negative sill, a zero range and a bad angle tolerance', () => {
		const ok = input();
		const bad = (patch: (o: Record<string, any>) => void) => {
			const o = structuredClone(ok) as Record<string, any>;
			patch(o);
			return variogramSaveSchema.safeParse(o).success;
		};
		expect(bad(() => {})).toBe(true);
		expect(bad((o) => (o.name = '   '))).toBe(false);
		expect(bad((o) => (o.model.structures[1].sill = -1))).toBe(false);
		expect(bad((o) => (o.model.structures[1].rangeVertical = 0))).toBe(false);
		expect(bad((o) => (o.model.structures = []))).toBe(false);
		expect(bad((o) => (o.settings.horizontal.angleTolerance = 95))).toBe(false);
		expect(bad((o) => (o.settings.vertical.nLags = 2.5))).toBe(false);
		expect(bad((o) => (o.misfit = Infinity))).toBe(false);
	});

	it('variogramSaveSchema takes the engine\'s transform names only, and readVariogramSettings converts the old ones', () => {
		const settings = input().settings;
		expect(variogramSaveSchema.safeParse({ ...input(), settings: { ...settings, transform: 'none' } }).success).toBe(true);
		expect(variogramSaveSchema.safeParse({ ...input(), settings: { ...settings, transform: 'raw' } }).success).toBe(false);
		expect(readVariogramSettings({ ...settings, transform: 'normal' }).transform).toBe('normal-score');
		expect(readVariogramSettings({ ...settings, transform: 'raw' }).transform).toBe('none');
		expect(readVariogramSettings(settings)).toEqual(settings);
		expect(() => readVariogramSettings({ ...settings, transform: 'log' })).toThrow();
		expect(() => readVariogramSettings(null)).toThrow();
	});

	it('variogramSaveSchema\'s model is the engine\'s schema with the workspace\'s limits on top', () => {
		const model = input().model;
		const ok = (m: unknown) => variogramSaveSchema.safeParse({ ...input(), model: m }).success;
		// What the engine refuses, the workspace refuses too.
		for (const bad of [
			{ ...model, structures: [{ ...model.structures[1], type: 'cubic' }] },
			{ ...model, structures: [{ ...model.structures[1], rangeMajor: 0 }] },
			{ ...model, azimuth: 'north' }
		]) {
			expect(engineModelSchema.safeParse(bad).success).toBe(false);
			expect(ok(bad)).toBe(false);
		}
		// The workspace adds: one to four structures, a total sill above 0, no unbounded (null) range.
		const unbounded = { ...model, structures: [model.structures[0], { ...model.structures[1], rangeMinor: null }] };
		expect(engineModelSchema.safeParse(unbounded).success).toBe(true);
		expect(ok(unbounded)).toBe(false);
		expect(ok({ ...model, structures: [] })).toBe(false);
		expect(ok({ ...model, structures: Array(5).fill(model.structures[1]) })).toBe(false);
		expect(ok({ ...model, structures: model.structures.map((st) => ({ ...st, sill: 0 })) })).toBe(false);
		expect(variogramSaveSchema.parse(input()).model).toEqual(model);
	});
});
