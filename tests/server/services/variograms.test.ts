import { beforeEach, describe, expect, it } from 'vitest';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { memberships, projects, users } from '../../../src/lib/server/db/schema';
import { domains, zonations } from '../../../src/lib/server/db/site-schema';
import { ServiceError } from '../../../src/lib/server/errors';
import {
	addComment,
	getVariogram,
	listComments,
	listVariograms,
	restoreVariogram,
	saveVariogram,
	VARIOGRAM_ROLES,
	type Actor
} from '../../../src/lib/server/services/variograms';
import { variogramSaveSchema, type VariogramSave } from '../../../src/lib/schemas/variogram';
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
	actor: Record<ProjectRole, Actor>;
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
	const actor = Object.fromEntries(roles.map((role, i) => [role, { userId: people[i].id, role }])) as Record<ProjectRole, Actor>;
	return { db, projectId: project.id, domainId: domainIn(project.id), otherProjectId: other.id, otherDomainId: domainIn(other.id), actor };
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
			transform: 'normal',
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
const save = (p: string, d: string, a: Actor, i: VariogramSave) => saveVariogram(p, d, a, i, w.db);
const list = (p: string, d: string, a: Actor) => listVariograms(p, d, a, w.db);
const get = (p: string, d: string, v: string, a: Actor) => getVariogram(p, d, v, a, w.db);
const restore = (p: string, d: string, v: string, a: Actor, note?: string) => restoreVariogram(p, d, v, a, note, w.db);
const comments = (p: string, d: string, v: string, a: Actor) => listComments(p, d, v, a, w.db);
const comment = (p: string, d: string, v: string, a: Actor, body: string) => addComment(p, d, v, a, body, w.db);

describe('variograms service', () => {
	beforeEach(async () => {
		w = await world();
	});

	it('saveVariogram numbers versions per name from 1, and keeps who, model, settings and misfit', () => {
		const a1 = save(w.projectId, w.domainId, w.actor.analyst, input());
		const a2 = save(w.projectId, w.domainId, w.actor.owner, input({ misfit: 10 }));
		const b1 = save(w.projectId, w.domainId, w.actor.analyst, input({ name: 'Sand, raw' }));
		expect([a1.version, a2.version, b1.version]).toEqual([1, 2, 1]);
		expect(a1.createdBy).toEqual({ id: w.actor.analyst.userId, name: 'The analyst' });
		expect(a2.createdBy!.name).toBe('The owner');
		expect(a1.model).toEqual(input().model);
		expect(a1.settings).toEqual(input().settings);
		expect(a1.misfit).toBe(12.5);
		expect(Date.parse(a1.createdAt)).toBeGreaterThan(0);
		const history = list(w.projectId, w.domainId, w.actor.viewer);
		expect(history).toHaveLength(3);
		expect(new Set(history.map((v) => `${v.name}#${v.version}`))).toEqual(new Set(['Sand, normal scores#1', 'Sand, normal scores#2', 'Sand, raw#1']));
	});

	it('saveVariogram trims the name, so " Sand, raw " continues the versions of "Sand, raw"', () => {
		save(w.projectId, w.domainId, w.actor.analyst, input({ name: 'Sand, raw' }));
		const v = save(w.projectId, w.domainId, w.actor.analyst, variogramSaveSchema.parse({ ...input(), name: '  Sand, raw ' }));
		expect(v).toMatchObject({ name: 'Sand, raw', version: 2 });
	});

	it('restoreVariogram saves the old parameters as a new version; the old version is unchanged', () => {
		const v1 = save(w.projectId, w.domainId, w.actor.analyst, input());
		const changed = input({ misfit: 3 });
		(changed.model.structures[1] as { rangeMajor: number }).rangeMajor = 80;
		const v2 = save(w.projectId, w.domainId, w.actor.analyst, changed);
		const v3 = restore(w.projectId, w.domainId, v1.id, w.actor.analyst);
		expect(v3.version).toBe(3);
		expect(v3.model).toEqual(v1.model);
		expect(v3.settings).toEqual(v1.settings);
		expect(v3.misfit).toBe(12.5);
		expect(v3.note).toBe('Restored from version 1.');
		expect(get(w.projectId, w.domainId, v2.id, w.actor.viewer).model).toEqual(changed.model);
		expect(get(w.projectId, w.domainId, v1.id, w.actor.viewer).version).toBe(1);
		const v4 = restore(w.projectId, w.domainId, v2.id, w.actor.owner, 'Back to the long range');
		expect(v4).toMatchObject({ version: 4, note: 'Back to the long range' });
	});

	it('addComment by a reviewer is listed with its author, oldest first, and counted on the variogram', () => {
		const v = save(w.projectId, w.domainId, w.actor.analyst, input());
		comment(w.projectId, w.domainId, v.id, w.actor.reviewer, 'The horizontal range rests on three bins.');
		comment(w.projectId, w.domainId, v.id, w.actor.analyst, 'Agreed; see the sensitivity.');
		const thread = comments(w.projectId, w.domainId, v.id, w.actor.viewer);
		expect(thread.map((c) => [c.author!.name, c.body])).toEqual([
			['The reviewer', 'The horizontal range rests on three bins.'],
			['The analyst', 'Agreed; see the sensitivity.']
		]);
		expect(get(w.projectId, w.domainId, v.id, w.actor.viewer).comments).toBe(2);
		expect(list(w.projectId, w.domainId, w.actor.viewer)[0].comments).toBe(2);
	});

	it('roles: viewers read, reviewers comment, analysts and owners save and restore (403 otherwise)', () => {
		expect(VARIOGRAM_ROLES).toEqual({ read: 'viewer', comment: 'reviewer', save: 'analyst', restore: 'analyst' });
		const v = save(w.projectId, w.domainId, w.actor.analyst, input());
		expectStatus(() => save(w.projectId, w.domainId, w.actor.viewer, input()), 403);
		expectStatus(() => save(w.projectId, w.domainId, w.actor.reviewer, input()), 403);
		expectStatus(() => restore(w.projectId, w.domainId, v.id, w.actor.reviewer), 403);
		expectStatus(() => comment(w.projectId, w.domainId, v.id, w.actor.viewer, 'no'), 403);
		expect(comment(w.projectId, w.domainId, v.id, w.actor.reviewer, 'yes').body).toBe('yes');
		expect(list(w.projectId, w.domainId, w.actor.viewer)).toHaveLength(1);
		expect(list(w.projectId, w.domainId, w.actor.viewer)).toHaveLength(1);
	});

	it('a domain or variogram of another project answers 404', () => {
		const v = save(w.projectId, w.domainId, w.actor.analyst, input());
		expectStatus(() => save(w.projectId, w.otherDomainId, w.actor.analyst, input()), 404);
		expectStatus(() => list(w.otherProjectId, w.domainId, w.actor.analyst), 404);
		expectStatus(() => get(w.projectId, w.domainId, 'no-such-id', w.actor.analyst), 404);
		expectStatus(() => get(w.otherProjectId, w.otherDomainId, v.id, w.actor.analyst), 404);
		expectStatus(() => comments(w.projectId, w.domainId, 'no-such-id', w.actor.analyst), 404);
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
});
