import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { build } from 'esbuild';
import type { Browser } from 'playwright-core';
import { fileURLToPath } from 'node:url';
import { launchChromium } from '../setup/chromium';
import { simulate, sha256, createRecipe, recipeHash, targetsFromDefinition } from '../../src/lib/geostat/index';
import type { SimulationInput, TargetDefinition, TargetPoints } from '../../src/lib/geostat/index';

// Bit-identity of the engine between Node.js and headless Chromium (DESIGN.md: a realization is a recipe).
// The engine is bundled as-is into an IIFE, run in the page on the same input, and the SHA-256 of the
// output's Float64 bytes compared with Node's. The input covers both search paths, exponential, Gaussian and
// spherical structures with a nugget (the covariance table), data off the grid, and solution reuse on a grid.

const root = fileURLToPath(new URL('../..', import.meta.url));

const input: SimulationInput = {
	seed: 'chromium-vs-node',
	domains: [
		{
			samples: Array.from({ length: 60 }, (_, i) => ({
				x: 4 + 11 * (i % 6),
				y: 0,
				z: -0.25 * Math.floor(i / 6),
				// exp/sin via Math are fine here: these are inputs, computed once in Node and sent to the page.
				value: 2 + Math.exp(0.3 * Math.sin(i * 1.7)) + 0.01 * i,
				sounding: `C${i % 6}`
			})),
			model: {
				azimuth: 90,
				structures: [
					{ type: 'nugget', sill: 0.05, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
					{ type: 'exponential', sill: 0.65, rangeMajor: 25, rangeMinor: Infinity, rangeVertical: 1.2 },
					{ type: 'gaussian', sill: 0.3, rangeMajor: 12, rangeMinor: Infinity, rangeVertical: 2 }
				]
			},
			transform: 'normal-score',
			kriging: 'simple',
			search: { maxData: 12, maxSimulated: 12, maxPerSounding: 4 }
		},
		{
			samples: [
				{ x: 10.3, y: 1.1, z: -3.3, value: 35 },
				{ x: 40.7, y: -0.4, z: -2.9, value: 41 }
			],
			model: { azimuth: 33, structures: [{ type: 'spherical', sill: 16, rangeMajor: 30, rangeMinor: 20, rangeVertical: 1.5 }] },
			transform: 'none',
			mean: 38,
			kriging: 'ordinary',
			// The multiple-grid path (issue 16) in the browser too; domain 0 keeps the random path.
			search: { maxData: 4, maxSimulated: 10, path: 'multigrid' }
		}
	]
};
const grid: TargetDefinition = { kind: 'grid', origin: { x: 0, y: 0, z: -4.75 }, spacing: { x: 1, y: 1, z: 0.25 }, counts: { x: 70, y: 1, z: 20 }, domainRuns: [[1, 280], [-1, 70], [0, 1050]] };

// Scattered targets (no lattice): the bucket-grid search and direct covariance path.
function scattered(): TargetPoints {
	const n = 400;
	const t: TargetPoints = { x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n), domain: new Int32Array(n) };
	for (let i = 0; i < n; i++) {
		t.x[i] = (i * 37) % 70 + 0.37 * ((i * 13) % 7);
		t.y[i] = 0;
		t.z[i] = -((i * 7) % 19) * 0.25 - 0.05;
		t.domain[i] = i % 2;
	}
	return t;
}

let browser: Browser;
let bundle: string;
let poolBundle: string;
let workerBundle: string;

async function iife(contents: string): Promise<string> {
	const out = await build({
		stdin: { contents, resolveDir: root, loader: 'ts' },
		bundle: true,
		format: 'iife',
		platform: 'browser',
		target: 'es2022',
		write: false,
		logLevel: 'silent'
	});
	return out.outputFiles[0].text;
}

beforeAll(async () => {
	bundle = await iife(`import { simulate, sha256, targetsFromDefinition, recipeInput, recipeHash } from './src/lib/geostat/index';
globalThis.conefieldEngine = { simulate, sha256, targetsFromDefinition, recipeInput, recipeHash };`);
	// The browser pool's worker module, bundled whole, and a page script driving RealizationPool over comlink.
	workerBundle = await iife(`import './workers/simulation.worker';`);
	poolBundle = await iife(`import * as Comlink from 'comlink';
import { RealizationPool } from './workers/realization-pool';
import { sha256, targetsFromDefinition, recipeInput } from './src/lib/geostat/index';
globalThis.runBrowserPool = async (workerCode, recipe, realizations) => {
	const url = URL.createObjectURL(new Blob([workerCode], { type: 'text/javascript' }));
	const pool = new RealizationPool(() => {
		const w = new Worker(url);
		return { remote: Comlink.wrap(w), terminate: () => w.terminate() };
	}, 2);
	const progress = [];
	const res = await pool.run(recipeInput(recipe), targetsFromDefinition(recipe.targets), realizations, { onProgress: (d, t) => progress.push([d, t]) });
	await pool.close();
	return { hashes: realizations.map((r) => sha256(new Uint8Array(res.get(r).buffer))), last: progress[progress.length - 1], calls: progress.length };
};`);
	browser = await launchChromium();
}, 120_000);

afterAll(async () => {
	await browser?.close();
});

function bytesHash(v: Float64Array): string {
	return sha256(new Uint8Array(v.buffer, v.byteOffset, v.byteLength));
}

describe('simulate in Chromium and in Node.js', () => {
	it('simulate(input, targets, r) gives the same SHA-256 of its Float64 bytes in headless Chromium and in Node (grid and scattered targets)', async () => {
		const page = await browser.newPage();
		await page.setContent('<!doctype html><title>engine</title>');
		await page.addScriptTag({ content: bundle });
		const recipe = createRecipe(input, grid);
		const scat = scattered();
		const realizations = [0, 7];
		const inPage = await page.evaluate(
			({ recipe, scat, realizations }) => {
				// eslint-disable-next-line @typescript-eslint/no-explicit-any
				const e = (globalThis as any).conefieldEngine;
				const hash = (v: Float64Array) => e.sha256(new Uint8Array(v.buffer));
				const domains = e.recipeInput(recipe);
				const t = e.targetsFromDefinition(recipe.targets);
				const pts = { x: Float64Array.from(scat.x), y: Float64Array.from(scat.y), z: Float64Array.from(scat.z), domain: Int32Array.from(scat.domain) };
				return {
					grid: realizations.map((r: number) => hash(e.simulate(domains, t, r))),
					scattered: realizations.map((r: number) => hash(e.simulate(domains, pts, r))),
					recipeHash: e.recipeHash(recipe),
					navigator: navigator.userAgent
				};
			},
			{ recipe, scat: { x: Array.from(scat.x), y: Array.from(scat.y), z: Array.from(scat.z), domain: Array.from(scat.domain) }, realizations }
		);
		await page.close();
		expect(inPage.navigator).toMatch(/Chrome/);
		const nodeGrid = realizations.map((r) => bytesHash(simulate(input, targetsFromDefinition(grid), r)));
		const nodeScattered = realizations.map((r) => bytesHash(simulate(input, scat, r)));
		expect(inPage.grid).toEqual(nodeGrid);
		expect(inPage.scattered).toEqual(nodeScattered);
		expect(inPage.recipeHash).toBe(recipeHash(recipe));
		// Different realizations really differ (the comparison is not between constant outputs).
		expect(nodeGrid[0]).not.toBe(nodeGrid[1]);
	}, 120_000);

	// The second input runs both domains on a constant path: a worker that makes two of the three realizations replays
	// the second from the plan its first recorded, in Chromium, and must still give Node's bits for that realization alone.
	const constant: SimulationInput = {
		...input,
		domains: input.domains.map((d, k) => ({ ...d, search: { ...d.search, path: k === 0 ? 'random-constant' : 'multigrid-constant' } }))
	};
	for (const [name, inp] of [['paths per realization', input], ['constant paths', constant]] as const) it(`RealizationPool over comlink module-worker code in Chromium returns the same bits as Node, with progress to (total, total) (${name})`, async () => {
		const page = await browser.newPage();
		// A routed http origin (no network): blob workers need a real origin, which about:blank lacks.
		await page.route('http://engine.test/**', (route) => route.fulfill({ contentType: 'text/html', body: '<!doctype html><title>pool</title>' }));
		await page.goto('http://engine.test/');
		await page.addScriptTag({ content: poolBundle });
		const recipe = createRecipe(inp, grid);
		const realizations = [2, 9, 4];
		const res = await page.evaluate(
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			({ code, recipe, realizations }) => (globalThis as any).runBrowserPool(code, recipe, realizations),
			{ code: workerBundle, recipe, realizations }
		);
		await page.close();
		const targets = targetsFromDefinition(grid);
		expect(res.hashes).toEqual(realizations.map((r) => bytesHash(simulate(inp, targets, r))));
		const active = Array.from(targets.domain).filter((d) => d >= 0).length;
		expect(res.last).toEqual([3 * active, 3 * active]);
		expect(res.calls).toBeGreaterThan(3);
	}, 120_000);
});
