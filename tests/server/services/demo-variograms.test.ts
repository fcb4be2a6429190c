import { beforeAll, describe, expect, it } from 'vitest';
import { totalSill } from '../../../src/lib/geostat/index';
import { seedDemoSoundings } from '../../../src/lib/server/services/demo-soundings';
import { OVERBANK_RULES, seedDemoStratigraphy } from '../../../src/lib/server/services/demo-stratigraphy';
import { DEMO_VARIOGRAM_NOTE, seedDemoVariograms } from '../../../src/lib/server/services/demo-variograms';
import { domainSamples } from '../../../src/lib/server/services/domains';
import { listVariograms } from '../../../src/lib/server/services/variograms';
import { listZonations, updateDomain } from '../../../src/lib/server/services/zonations';
import { DEFAULT_RULES } from '../../../src/lib/site/index';
import { siteTestProject, type SiteTestProject } from './site-db';

let t: SiteTestProject;
beforeAll(async () => {
	t = siteTestProject('Demo variograms');
	seedDemoSoundings(t.db, t.projectId, t.userId);
	seedDemoStratigraphy(t.db, t.projectId);
	await seedDemoVariograms(t.db, t.projectId, t.userId);
}, 120_000);

describe('the demo overbank clay', () => {
	/**
	 * A soft, normally consolidated clay has su/σ′v of about 0.2–0.35 (common practice). With the demo's rules
	 * (the crust, above 1.25 m depth, left out) the domain's declustered mean, P10, P50 and P90 lie within that
	 * range; with every reading kept the crust, where σ′v tends to zero, lifts the mean far above it.
	 */
	it('the overbank clay domain reads as a soft normally consolidated clay: mean and P10–P90 of su/σ′v within 0.2–0.35', () => {
		for (const z of listZonations(t.projectId, t.db)) {
			const d = z.domains.find((x) => x.name === 'Overbank clay')!;
			expect(d.rules).toEqual(OVERBANK_RULES);
			expect(OVERBANK_RULES.minDepth).toBe(1.25);
			const s = domainSamples(t.projectId, d.id, t.db);
			expect(s.counts.minDepth).toBeGreaterThan(1000);
			for (const k of ['mean', 'p10', 'p50', 'p90'] as const) {
				expect(s.stats[k], k).toBeGreaterThanOrEqual(0.2);
				expect(s.stats[k], k).toBeLessThanOrEqual(0.35);
			}
			expect(s.stats.n).toBeGreaterThan(100);
		}
	});

	it('without the rules the crust lifts the overbank clay\'s mean su/σ′v above 0.5', () => {
		const d = listZonations(t.projectId, t.db)[0].domains.find((x) => x.name === 'Overbank clay')!;
		updateDomain(t.projectId, d.id, { rules: DEFAULT_RULES }, t.db);
		const s = domainSamples(t.projectId, d.id, t.db);
		expect(s.stats.mean).toBeGreaterThan(0.5);
		expect(s.stats.p90).toBeGreaterThan(1);
		updateDomain(t.projectId, d.id, { rules: OVERBANK_RULES }, t.db);
	});
});

describe('seedDemoVariograms(db, projectId, userId)', () => {
	it('every domain of both demo zonations has a saved variogram, version 1, fitted by the automatic fit with the sill at the variance', () => {
		const zonations = listZonations(t.projectId, t.db);
		expect(zonations.map((z) => z.domains.length)).toEqual([5, 4]);
		const ranges: string[] = [];
		for (const z of zonations) {
			for (const d of z.domains) {
				const versions = listVariograms(t.projectId, d.id, t.db);
				expect(versions, `${z.name} / ${d.name}`).toHaveLength(1);
				const [v] = versions;
				expect([v.name, v.version]).toEqual([d.name, 1]);
				expect(v.note.startsWith(DEMO_VARIOGRAM_NOTE)).toBe(true);
				expect(v.settings).toMatchObject({ transform: 'normal-score', declustered: true, trend: 'none', fit: { type: 'exponential', nugget: 'fit', sill: 'variance' } });
				// The declustered variance of normal scores is 1 up to the plotting positions (within 2 %).
				expect(Math.abs(totalSill(v.model) - 1)).toBeLessThan(0.02);
				const s = v.model.structures[1];
				expect(v.model.structures[0].type).toBe('nugget');
				for (const r of [s.rangeVertical, s.rangeMajor]) expect(r > 0 && Number.isFinite(r)).toBe(true);
				expect(s.rangeMinor).toBe(s.rangeMajor);
				ranges.push(`${z.name} / ${d.name}: vertical ${s.rangeVertical.toFixed(2)} m, horizontal ${s.rangeMajor.toFixed(1)} m, nugget ${v.model.structures[0].sill.toFixed(2)}`);
			}
		}
		console.log(ranges.join('\n'));
	});

	it('the grouped point-bar sand (two populations either side of the channel) carries the plateau warning in its note', () => {
		const grouped = listZonations(t.projectId, t.db)[1].domains.find((d) => d.name === 'Point-bar sand')!;
		const [v] = listVariograms(t.projectId, grouped.id, t.db);
		expect(v.note).toMatch(/Warning: The vertical variogram levels off at .* below the variance/);
		expect(v.note).toMatch(/mixed populations/);
		const west = listZonations(t.projectId, t.db)[0].domains.find((d) => d.name === 'Point-bar sand west')!;
		expect(listVariograms(t.projectId, west.id, t.db)[0].note).toBe(DEMO_VARIOGRAM_NOTE);
	});
});
