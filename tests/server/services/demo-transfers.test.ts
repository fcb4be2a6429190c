/**
 * The demo's transfer set: saved with the demo, and on the demo's split recipe it gives every sand domain Dr and CRR
 * and the clay su, at values the cited equations give (Idriss & Boulanger 2008; Boulanger & Idriss 2014).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { seedDemo } from '../../../src/lib/server/services/demo';
import { DEMO_TRANSFER_SET } from '../../../src/lib/server/services/demo-transfers';
import { csvLayout, exportContext } from '../../../src/lib/server/services/exports';
import { listRecipes } from '../../../src/lib/server/services/recipes';
import { listTransferSets } from '../../../src/lib/server/services/transfers';
import { stopRealizations } from '../../../src/lib/server/realizations';

let db: Db;
let projectId: string;

beforeAll(async () => {
	db = openDatabase(':memory:');
	projectId = (await seedDemo(db))!;
}, 600_000);
afterAll(() => stopRealizations());

describe('the demo’s transfer set', () => {
	it('is saved once, version 1, with a rule for the sands’ qc1Ncs and the clay’s su/σ′v', () => {
		const sets = listTransferSets(projectId, db);
		expect(sets.map((s) => [s.name, s.version])).toEqual([[DEMO_TRANSFER_SET, 1]]);
		expect(sets[0].rules.map((r) => r.property).sort()).toEqual(['qc1Ncs', 'suRatio']);
	});

	it('carries every domain of the split recipe to its parameters, at the published equations', () => {
		const split = listRecipes(projectId, db).find((r) => r.name.startsWith('Sand split at channel'))!;
		const set = listTransferSets(projectId, db)[0];
		const ctx = exportContext(projectId, split.id, set.id, db);
		const layout = csvLayout(ctx);
		expect(layout.outputs.map((o) => o.header.replace(/ \(.*\)$/, '')).sort()).toEqual(['CRR_M7.5_1atm', 'Dr', 'su']);
		for (const d of ctx.domains) {
			const outs = layout.perDomain[d.index];
			expect(outs.length, d.name).toBe(d.property === 'qc1Ncs' ? 2 : 1);
			if (d.property !== 'qc1Ncs') continue;
			// qc1Ncs = 100: Dr = 0.465·(100/0.9)^0.264 − 1.063 = 0.5496…; CRR = exp(100/113 + 0.1² − (100/140)³ + (100/137)⁴ − 2.80) = 0.1373…
			// (worked by hand from the equations in Idriss & Boulanger 2008 and Boulanger & Idriss 2014).
			expect(outs[0].of(100, 0)).toBeCloseTo(0.465 * Math.pow(100 / 0.9, 0.264) - 1.063, 12);
			expect(outs[1].of(100, 0)).toBeCloseTo(Math.exp(100 / 113 + 0.01 - Math.pow(100 / 140, 3) + Math.pow(100 / 137, 4) - 2.8), 12);
			expect(outs[0].of(100, 0)).toBeCloseTo(0.5496, 4);
			expect(outs[1].of(100, 0)).toBeCloseTo(0.1373, 4);
		}
	});
});
