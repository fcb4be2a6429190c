import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { count, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { derive } from '../../../src/lib/cpt/index';
import { soundings } from '../../../src/lib/server/db/site-schema';
import { GROUNDWATER_ELEVATION, LEVEE_UNITS, unitTops } from '../../../src/lib/server/scenario/levee';
import { TRUTH_DOMAINS } from '../../../src/lib/server/scenario/synthesize';
import { seedDemoSoundings } from '../../../src/lib/server/services/demo-soundings';
import { listSoundings } from '../../../src/lib/server/services/soundings';
import { DEMO_DIR, DEMO_SEED, NOISE_LEVEL, demoFilesOf, demoSoundings, type DemoSounding } from '../../../scripts/generate-demo';
import { testProject } from './soundings-db';

// The generator runs one unconditional simulation of about 20 000 nodes: seconds on this machine.
const SLOW = 120_000;
let demo: DemoSounding[];
beforeAll(() => {
	demo = demoSoundings(DEMO_SEED);
}, SLOW);

function committedFiles(): Map<string, string> {
	const out = new Map<string, string>();
	const walk = (dir: string, prefix: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			if (entry.isDirectory()) walk(join(dir, entry.name), `${prefix}${entry.name}/`);
			else if (entry.name !== 'README.md') out.set(prefix + entry.name, readFileSync(join(dir, entry.name), 'utf8'));
		}
	};
	walk(DEMO_DIR, '');
	return out;
}

describe('scripts/generate-demo', () => {
	it('demoFiles(seed) regenerates the committed static/demo files byte for byte', () => {
		const generated = demoFilesOf(demo);
		const committed = committedFiles();
		expect([...generated.keys()].sort()).toEqual([...committed.keys()].sort());
		expect(generated.size).toBe(27);
		for (const [path, text] of generated) expect(text === committed.get(path), path).toBe(true);
	});

	it('demoSoundings(seed) reads every 0.02 m from 0.1 m depth down to elevation −12 m in 25 soundings', () => {
		expect(demo.map((s) => s.scenario.id)).toEqual(Array.from({ length: 25 }, (_, i) => `LV-${String(i + 1).padStart(2, '0')}`));
		for (const s of demo) {
			expect(s.depth[0]).toBe(0.1);
			// Depths are rounded to the millimetre by construction; steps of 0.02 m within 1e-9 m.
			for (let i = 1; i < s.depth.length; i++) expect(Math.abs(s.depth[i] - s.depth[i - 1] - 0.02)).toBeLessThan(1e-9);
			const bottom = s.scenario.groundElevation - s.depth[s.depth.length - 1];
			expect(bottom).toBeGreaterThanOrEqual(-12 - 1e-9);
			expect(bottom).toBeLessThan(-12 + 0.02);
		}
	});

	it('demoSoundings(seed) rounds qc to 1 kPa and fs, u2 to 0.1 kPa, as written to every file', () => {
		for (const s of demo.slice(0, 3)) {
			for (let i = 0; i < s.qc.length; i++) {
				expect(Number.isInteger(s.qc[i])).toBe(true);
				// Rounded to one decimal: ten times the value is a whole number within float error 1e-9.
				expect(Math.abs(s.fs[i] * 10 - Math.round(s.fs[i] * 10))).toBeLessThan(1e-9);
				expect(Math.abs(s.u2[i] * 10 - Math.round(s.u2[i] * 10))).toBeLessThan(1e-9);
			}
		}
	});

	/**
	 * Deriving the demo soundings with the scenario's own units and groundwater gives back the target property
	 * (qc1Ncs in sands, su/σ'v in clays), because the synthesis inverts the same correlations (Robertson 2009,
	 * Boulanger & Idriss 2014, su = (qt − σv)/Nkt of Lunne et al. 1997). What remains is the measurement noise:
	 * qc and fs are multiplied by 1 + 0.02·N(0, 1) (NOISE_LEVEL), which the correlations pass on with a gain of
	 * at most about 1.5 (qc/(qt − σv) in the soft clay), plus rounding. Per truth domain, on ln(derived/target):
	 * bias within NOISE_LEVEL/4, standard deviation within 1.5·NOISE_LEVEL, every reading within 4 such deviations.
	 * In sands where the synthesis could not reach its target Ic (the Robertson chart has no friction ratio for a
	 * low Qtn at a low Ic) the fines content, and so qc1Ncs, differs; those readings (Ic off target by over 0.1)
	 * are counted separately and kept under 8 %.
	 */
	it('derive(demo sounding) gives back the scenario target qc1Ncs and su/σ′v within the stated noise', () => {
		const errors = new Map<string, number[]>(TRUTH_DOMAINS.map((d) => [d, []]));
		const offTarget = new Map<string, number>(TRUTH_DOMAINS.map((d) => [d, 0]));
		for (const s of demo) {
			const tops = unitTops(s.scenario.chainage);
			const units = LEVEE_UNITS.map((u) => ({ topElevation: tops[u.key], gammaAbove: u.gammaAbove, gammaBelow: u.gammaBelow, Nkt: u.nkt, CFC: u.cfc }))
				.filter((u) => !Number.isNaN(u.topElevation))
				.sort((a, b) => b.topElevation - a.topElevation);
			const d = derive(
				{ depth: s.depth, qc: s.qc, fs: s.fs, u2: s.u2, groundElevation: s.scenario.groundElevation, areaRatio: 0.8 },
				{ units, groundwaterElevation: GROUNDWATER_ELEVATION }
			);
			for (let i = 0; i < s.depth.length; i++) {
				const domain = s.domain[i];
				const clay = domain === 'overbank' || domain === 'plug';
				if (!clay && !(Math.abs(d.Ic[i] - s.ic[i]) <= 0.1)) {
					offTarget.set(domain, offTarget.get(domain)! + 1);
					continue;
				}
				errors.get(domain)!.push(Math.log((clay ? d.suRatio[i] : d.qc1Ncs[i]) / s.target[i]));
			}
		}
		const sd = 1.5 * NOISE_LEVEL;
		for (const [domain, e] of errors) {
			expect(e.length, domain).toBeGreaterThan(500);
			const mean = e.reduce((a, b) => a + b, 0) / e.length;
			const spread = Math.sqrt(e.reduce((a, b) => a + (b - mean) ** 2, 0) / e.length);
			expect(Math.abs(mean), `${domain} bias`).toBeLessThanOrEqual(NOISE_LEVEL / 4);
			expect(spread, `${domain} sd`).toBeLessThanOrEqual(sd);
			expect(Math.max(...e.map(Math.abs)), `${domain} largest error`).toBeLessThanOrEqual(4 * sd);
			expect(offTarget.get(domain)! / (e.length + offTarget.get(domain)!), `${domain} off-target Ic`).toBeLessThan(0.08);
		}
	});
});

describe('seedDemoSoundings(db, projectId, userId)', () => {
	it('seedDemoSoundings imports the 25 demo GEF files through the import service', async () => {
		const t = await testProject('Demo');
		const result = seedDemoSoundings(t.db, t.projectId, t.userId);
		expect(result.files).toHaveLength(25);
		expect(result.files.every((f) => f.format === 'gef' && f.soundings.length === 1)).toBe(true);
		const list = listSoundings(t.projectId, t.db);
		expect(list.map((s) => s.name)).toEqual(demo.map((s) => s.scenario.id));
		expect(list.map((s) => s.readings)).toEqual(demo.map((s) => s.depth.length));
		expect(t.db.select({ n: count() }).from(soundings).where(eq(soundings.projectId, t.projectId)).get()!.n).toBe(25);
	});
});
