import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoSoundings } from '../../src/lib/server/services/demo-soundings';
import { seedDemoStratigraphy } from '../../src/lib/server/services/demo-stratigraphy';
import { domainSamples } from '../../src/lib/server/services/domains';
import { listZonations } from '../../src/lib/server/services/zonations';
import { recipeHash, recipeSchema, targetsFromDefinition } from '../../src/lib/geostat/index';
import { DEMO_DOMAINS, demoDomainSamples, demoRecipe } from '../../scripts/demo-recipe';
import { siteTestProject, type SiteTestProject } from '../server/services/site-db';
import { expectAbsClose } from '../asserts';

// scripts/demo-recipe.ts writes the app's derivation and domain steps again with relative imports (for tsx, which
// runs the benchmarks); these tests hold it to the app: its samples are the demo project's domain samples.

let t: SiteTestProject;
beforeAll(() => {
	t = siteTestProject('Demo recipe');
	seedDemoSoundings(t.db, t.projectId, t.userId);
	seedDemoStratigraphy(t.db, t.projectId);
}, 60_000);

describe('scripts/demo-recipe', () => {
	it('demoDomainSamples() equals domainSamples() of the demo zonation "Sand split at channel", domain by domain (chainage within 1e-6 m, elevation and value within 1e-9)', () => {
		const split = listZonations(t.projectId, t.db)[0];
		expect(split.domains.map((d) => d.name)).toEqual([...DEMO_DOMAINS]);
		const mine = demoDomainSamples();
		split.domains.forEach((d, k) => {
			const app = domainSamples(t.projectId, d.id, t.db).samples;
			expect(mine[k].length, d.name).toBe(app.x.length);
			mine[k].forEach((s, i) => {
				expect(s.sounding).toBe(app.sounding[i]);
				// Chainage: the app projects onto its stored section line (end point rounded to 0.01 m).
				expectAbsClose(s.x, app.x[i], 1e-6, `${d.name} x[${i}]`);
				expectAbsClose(s.z, app.z[i], 1e-9, `${d.name} z[${i}]`);
				expectAbsClose(s.value, app.value[i], 1e-9 * Math.max(1, Math.abs(app.value[i])), `${d.name} value[${i}]`);
			});
		});
	});

	it('demoRecipe() is a valid recipe of five normal-score domains on the 400 × 80 section, repeatable to the hash', () => {
		const r = demoRecipe();
		expect(recipeSchema.safeParse(r).success).toBe(true);
		expect(r.input.domains.length).toBe(5);
		const targets = targetsFromDefinition(r.targets);
		expect(targets.x.length).toBe(32_000);
		expect(Array.from(targets.domain).filter((d) => d >= 0).length).toBeGreaterThan(31_000);
		expect(recipeHash(demoRecipe())).toBe(recipeHash(r));
	});
});
