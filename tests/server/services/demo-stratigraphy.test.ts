import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoSoundings } from '../../../src/lib/server/services/demo-soundings';
import { seedDemoStratigraphy } from '../../../src/lib/server/services/demo-stratigraphy';
import { domainSamples } from '../../../src/lib/server/services/domains';
import { deriveSoundings } from '../../../src/lib/server/services/derived';
import { listContacts, listUnits, listZoneBoundaries } from '../../../src/lib/server/services/stratigraphy';
import { listZonations } from '../../../src/lib/server/services/zonations';
import { CHANNEL_AXIS, scenarioSoundings, unitAt } from '../../../src/lib/server/scenario/levee';
import { siteTestProject, type SiteTestProject } from './site-db';

let t: SiteTestProject;
beforeAll(() => {
	t = siteTestProject('Demo');
	seedDemoSoundings(t.db, t.projectId, t.userId);
	seedDemoStratigraphy(t.db, t.projectId);
}, 60_000);

describe('seedDemoStratigraphy(db, projectId)', () => {
	it('seedDemoStratigraphy(db, p) stores the four units in stacking order and the sand split West | East', () => {
		const units = listUnits(t.projectId, t.db);
		expect(units.map((u) => u.name)).toEqual(['Overbank clay', 'Channel plug clay', 'Point-bar sand', 'Dense sand']);
		expect(units[2].zoneNames).toEqual(['West', 'East']);
		const [b] = listZoneBoundaries(t.projectId, t.db);
		expect([b.chainageTop, b.chainageBottom]).toEqual([CHANNEL_AXIS, CHANNEL_AXIS]);
	});

	it('seedDemoStratigraphy(db, p) gives every demo sounding contacts, with no warning about their order', () => {
		const contacts = listContacts(t.projectId, t.db);
		expect(new Set(contacts.map((c) => c.soundingName)).size).toBe(scenarioSoundings().length);
		const derived = deriveSoundings(t.projectId, undefined, t.db);
		for (const d of derived) {
			expect(d.warnings, d.sounding.name).toEqual([]);
			expect(d.sounding.source).toBe('projected');
		}
	});

	it('seedDemoStratigraphy(db, p) creates both zonations with the scenario domains', () => {
		const z = listZonations(t.projectId, t.db);
		expect(z.map((x) => x.name)).toEqual(['Sand split at channel', 'Sand grouped']);
		expect(z[0].domains.map((d) => d.name)).toEqual([
			'Overbank clay',
			'Point-bar sand west',
			'Point-bar sand east',
			'Channel plug clay',
			'Dense sand'
		]);
		expect(z[1].domains.map((d) => d.name)).toEqual(['Overbank clay', 'Point-bar sand', 'Channel plug clay', 'Dense sand']);
		expect(z[1].domains[1].members).toMatchObject([{ unitName: 'Point-bar sand', zone: -1 }]);
	});

	it('domainSamples on the demo recovers the looser sand west of the channel than east of it', () => {
		const split = listZonations(t.projectId, t.db)[0];
		const west = domainSamples(t.projectId, split.domains[1].id, t.db);
		const east = domainSamples(t.projectId, split.domains[2].id, t.db);
		expect(west.samples.x.every((c) => c < CHANNEL_AXIS)).toBe(true);
		expect(east.samples.x.every((c) => c >= CHANNEL_AXIS)).toBe(true);
		// The scenario's true medians are 80 (west) and 125 (east) (synthesize.ts); noise, the correlated field and
		// 25 soundings allow a loose ±20 % check only.
		expect(west.stats.p50).toBeGreaterThan(64);
		expect(west.stats.p50).toBeLessThan(96);
		expect(east.stats.p50).toBeGreaterThan(100);
		expect(east.stats.p50).toBeLessThan(150);
		const grouped = domainSamples(t.projectId, listZonations(t.projectId, t.db)[1].domains[1].id, t.db);
		expect(grouped.stats.n).toBe(west.stats.n + east.stats.n);
	});
});

describe('seedDemoStratigraphy(db, projectId) contacts', () => {
	it('seedDemoStratigraphy(db, p) places each reading in the unit the scenario synthesised it in', () => {
		const derived = deriveSoundings(t.projectId, undefined, t.db);
		const byName = new Map(scenarioSoundings().map((s) => [s.id, s]));
		const keyOf: Record<string, string> = {
			'Overbank clay': 'overbank',
			'Channel plug clay': 'plug',
			'Point-bar sand': 'pointbar',
			'Dense sand': 'dense'
		};
		let checked = 0;
		for (const d of derived) {
			const c = byName.get(d.sounding.name)!.chainage;
			for (let i = 0; i < d.unit.length; i++) {
				expect(keyOf[d.units[d.unit[i]].name], `${d.sounding.name} at ${d.derived.elevation[i]}`).toBe(unitAt(c, d.derived.elevation[i]));
				checked++;
			}
		}
		expect(checked).toBeGreaterThan(10_000);
	});
});
