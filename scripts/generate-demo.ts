/**
 * Generates the demo CPT files of the invented riverside-levee scenario (see static/demo/README.md):
 * a true standard-Gaussian field per truth domain from the engine's unconditional sequential Gaussian
 * simulation, plus independent measurement noise, turned into qc, fs and u2 by synthesizeSounding, and
 * written as one CSV, one GEF file per sounding and one AGS4 file with the CPT library's writers.
 * Same seed, same bytes. Run with `npx tsx scripts/generate-demo.ts` (writes static/demo/).
 *
 * Relative imports only: tsx does not know SvelteKit's $lib alias.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import seedrandom from 'seedrandom';
import { formatAgs4, formatDelimited, formatGef, type ParsedSounding } from '../src/lib/cpt/index';
import { inverseNormalCdf, simulate, type DomainInput, type SimulationInput } from '../src/lib/geostat/index';
import { AREA_RATIO, BOTTOM_ELEVATION, scenarioSoundings, type ScenarioSounding } from '../src/lib/server/scenario/levee';
import { readingDepths, synthesizeSounding, TRUTH_DOMAINS, truthDomainAt, type TruthDomain } from '../src/lib/server/scenario/synthesize';

export const DEMO_SEED = 'riverside-levee-demo';

/** Correlation of the true field: exponential, practical ranges in m (vertical, horizontal), per truth domain. */
export const TRUTH_RANGES: Record<TruthDomain, { vertical: number; horizontal: number }> = {
	overbank: { vertical: 0.8, horizontal: 20 },
	'pointbar-west': { vertical: 1.2, horizontal: 30 },
	'pointbar-east': { vertical: 1.2, horizontal: 30 },
	plug: { vertical: 0.8, horizontal: 20 },
	dense: { vertical: 1.2, horizontal: 30 }
};

/** Relative standard deviation of the multiplicative measurement noise on qc and fs (synthesizeSounding's default). */
export const NOISE_LEVEL = 0.02;

/** Rounding of the written readings: qc to 1 kPa, fs and u2 to 0.1 kPa. */
const round = (v: number, step: number): number => Math.round(v / step) * step;

export interface DemoSounding {
	scenario: ScenarioSounding;
	depth: Float64Array;
	/** Rounded readings, kPa, as written to every file. */
	qc: Float64Array;
	fs: Float64Array;
	u2: Float64Array;
	/** The true simulated property at each reading (qc1Ncs in sands, su/σ'v in clays) and its truth domain. */
	target: Float64Array;
	/** The Ic the synthesis aimed at (Robertson 2009). */
	ic: Float64Array;
	domain: TruthDomain[];
}

/** The 25 demo soundings: the true field, the synthesis and the rounding, all from `seed`. */
export function demoSoundings(seed = DEMO_SEED): DemoSounding[] {
	const layout = scenarioSoundings();
	const depths = layout.map((s) => readingDepths(s, BOTTOM_ELEVATION));
	const total = depths.reduce((n, d) => n + d.length, 0);
	const targets = { x: new Float64Array(total), y: new Float64Array(total), z: new Float64Array(total), domain: new Int32Array(total) };
	let k = 0;
	layout.forEach((s, j) => {
		for (const d of depths[j]) {
			const z = s.groundElevation - d;
			targets.x[k] = s.chainage;
			targets.y[k] = 0;
			targets.z[k] = z;
			targets.domain[k] = TRUTH_DOMAINS.indexOf(truthDomainAt(s.chainage, z));
			k++;
		}
	});
	const domains: DomainInput[] = TRUTH_DOMAINS.map((d) => ({
		samples: [],
		model: {
			azimuth: 90,
			structures: [
				{ type: 'exponential', sill: 1, rangeMajor: TRUTH_RANGES[d].horizontal, rangeMinor: TRUTH_RANGES[d].horizontal, rangeVertical: TRUTH_RANGES[d].vertical }
			]
		},
		transform: 'none',
		mean: 0,
		kriging: 'simple',
		search: { maxData: 0, maxSimulated: 32 }
	}));
	const input: SimulationInput = { seed, domains };
	const field = simulate(input, targets, 0);

	let offset = 0;
	return layout.map((s, j) => {
		const depth = depths[j];
		const n = depth.length;
		const noise = new Float64Array(n);
		const prng = seedrandom.alea(`${seed}:noise:${s.id}`);
		for (let i = 0; i < n; i++) noise[i] = inverseNormalCdf(openUnit(prng.double()));
		const synth = synthesizeSounding({ sounding: s, depth, field: field.slice(offset, offset + n), noise, noiseLevel: NOISE_LEVEL });
		offset += n;
		return {
			scenario: s,
			depth,
			qc: synth.qc.map((v) => round(v, 1)),
			fs: synth.fs.map((v) => round(v, 0.1)),
			u2: synth.u2.map((v) => round(v, 0.1)),
			target: synth.target,
			ic: synth.ic,
			domain: synth.domain
		};
	});
}

/** The demo soundings as the parsers would return them (m, kPa; located by easting and northing). */
export function asParsed(s: DemoSounding): ParsedSounding {
	const { id, x, y, groundElevation } = s.scenario;
	return { id, x, y, groundElevation, areaRatio: AREA_RATIO, depth: s.depth, qc: s.qc, fs: s.fs, u2: s.u2 };
}

/** Every generated file, by its path under static/demo/, as text. */
export function demoFiles(seed = DEMO_SEED): Map<string, string> {
	return demoFilesOf(demoSoundings(seed));
}

/** The files of given demo soundings (see demoFiles). */
export function demoFilesOf(demo: DemoSounding[]): Map<string, string> {
	const parsed = demo.map(asParsed);
	const files = new Map<string, string>();
	files.set('levee-cpt.csv', formatDelimited(parsed, { decimals: { depth: 2, qc: 3, fs: 1, u2: 1, coordinates: 2 } }));
	files.set('levee-cpt.ags', formatAgs4(parsed, { projectId: 'RIVERSIDE-LEVEE-DEMO', decimals: { depth: 2, qc: 3, fs: 1, u2: 4, coordinates: 2 } }));
	for (const s of parsed) files.set(`gef/${s.id}.gef`, formatGef(s, { decimals: { depth: 2, qc: 3, fs: 4, u2: 4, coordinates: 2 } }));
	return files;
}

/** Where the files go: static/demo of the checkout. */
export const DEMO_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '..', 'static', 'demo');

// A uniform of [0, 1) moved into (0, 1), where the inverse normal CDF is finite.
function openUnit(u: number): number {
	return u > 0 ? u : 2 ** -53;
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
	const started = Date.now();
	const files = demoFiles();
	for (const [path, text] of files) {
		const target = join(DEMO_DIR, path);
		mkdirSync(dirname(target), { recursive: true });
		writeFileSync(target, text);
	}
	console.log(`wrote ${files.size} files to ${DEMO_DIR} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}
