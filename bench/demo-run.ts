// "demo-run" (issue 12): the demo's split-zonation recipe (400 × 85 cells at 1 m × 0.2 m, 5 domains, 20
// realizations) through the server's node pool on all cores, as the summary endpoint makes it: the seconds for all
// 20 and per realization, and the same for the summary's work from a cold start (regenerate all 20, then the
// ensemble map on a worker), plus the ensemble maps alone. The demo is seeded into an in-memory database with the
// app's own services; worker start-up (tsx loading the engine) is left out of the timings. "demo-run:constant": the
// same recipe with every domain on a constant random path (search.path 'random-constant'), a recipe of its own.
import { availableParallelism } from 'node:os';
import { openDatabase } from '../src/lib/server/db';
import { seedDemo } from '../src/lib/server/services/demo';
import { createRecipe, getRecipe, listRecipes, loadRecipe } from '../src/lib/server/services/recipes';
import type { RecipeSetup } from '../src/lib/schemas/recipe';
import { recipeSummary } from '../src/lib/server/services/summaries';
import { ensembleMapOffThread, ensembleOf, stopRealizations, useRealizationPool } from '../src/lib/server/realizations';
import { createNodePool } from '../workers/node-pool';
import type { BenchCase } from './index';

const round = (x: number, digits = 2) => Number(x.toFixed(digits));

/** The setup with every simulated domain on a constant random path, under a name of its own. */
function constantSetup(setup: RecipeSetup): RecipeSetup {
	if (setup.kind === 'uniform') throw new Error('the demo recipe is an SGS recipe');
	return { ...setup, name: `${setup.name} (constant path)`, domains: setup.domains.map((d) => (d.simulate ? { ...d, search: { ...d.search, path: 'random-constant' } } : d)) };
}

async function warmPool(cores: number) {
	const pool = createNodePool({ size: cores });
	// Each worker starts and prepares once outside the timing (a 2-cell section of the engine's own test input).
	await pool.run(
		{ seed: 'warm', domains: [{ samples: [{ x: 0, y: 0, z: 0, value: 1 }], model: { azimuth: 0, structures: [{ type: 'exponential', sill: 1, rangeMajor: 1, rangeMinor: 1, rangeVertical: 1 }] }, transform: 'normal-score', kriging: 'simple', search: { maxData: 1, maxSimulated: 1 } }] },
		{ x: new Float64Array(2), y: new Float64Array(2), z: Float64Array.of(0, 1), domain: new Int32Array(2) },
		Array.from({ length: cores }, (_, r) => r)
	);
	useRealizationPool(pool);
}

async function run(constant: boolean): Promise<Record<string, number>> {
	const cores = availableParallelism();
	const db = openDatabase(':memory:');
	const projectId = (await seedDemo(db))!;
	let summary = listRecipes(projectId, db).find((r) => r.name.startsWith('Sand split at channel'))!;
	if (constant) summary = createRecipe(projectId, summary.createdBy!.id, constantSetup(getRecipe(projectId, summary.id, db).setup), db).recipe;
	const { hash, recipe } = loadRecipe(projectId, summary.id, db);
	const def = recipe.targets.kind === 'grid' ? recipe.targets : null;
	const cells = def ? def.counts.x * def.counts.y * def.counts.z : 0;
	const simulated = def ? def.domainRuns.filter(([d]) => d >= 0).reduce((a, [, n]) => a + n, 0) : 0;

	await warmPool(cores);
	let t = performance.now();
	const realizations = await ensembleOf(hash, recipe);
	const realizationsMs = performance.now() - t;
	t = performance.now();
	await ensembleMapOffThread(realizations, 'mean');
	const meanMs = performance.now() - t;
	t = performance.now();
	await ensembleMapOffThread(realizations, 'p50');
	const p50Ms = performance.now() - t;
	await stopRealizations();

	// The summary endpoint's work from cold: nothing cached, a fresh pool (started outside the timing).
	await warmPool(cores);
	t = performance.now();
	await recipeSummary(projectId, summary.id, 'mean', null, db);
	const summaryMs = performance.now() - t;
	await stopRealizations();
	return {
		cells,
		simulated,
		realizations: realizations.length,
		cores,
		seconds: round(realizationsMs / 1000),
		secondsPerRealization: round(realizationsMs / 1000 / realizations.length),
		summarySeconds: round(summaryMs / 1000),
		summarySecondsPerRealization: round(summaryMs / 1000 / realizations.length),
		meanMapMs: Math.round(meanMs),
		p50MapMs: Math.round(p50Ms)
	};
}

const cases: BenchCase[] = [
	{ name: 'demo-run', run: () => run(false) },
	{ name: 'demo-run:constant', run: () => run(true) }
];
export default cases;
