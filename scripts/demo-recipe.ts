/**
 * A simulation recipe built like the demo's, from the demo's own files: the 25 GEF soundings of static/demo
 * parsed with the CPT library, placed on the section line, derived (Robertson 2009; Boulanger & Idriss 2014)
 * with the demo's units and contacts, split into the five domains of the demo zonation "Sand split at channel"
 * (overbank clay and channel plug clay in su/σ'v, point-bar sand west and east of the channel and dense sand in
 * qc1Ncs), the overbank clay without its crust (the demo's rule: readings shallower than OVERBANK_MIN_DEPTH
 * left out), averaged to 0.2 m windows as the demo domains are, declustered with 40 m plan cells, on a
 * 400 × 80 section grid at 1 m × 0.2 m. The conditioning data sit at the soundings' own chainages and at the
 * mean elevation of their windows, so off the grid's nodes — where users' data live.
 *
 * The same steps as the app's services (src/lib/server/services/derived.ts, domains.ts,
 * demo-stratigraphy.ts), written again here with relative imports because tsx, which runs the benchmarks,
 * does not know SvelteKit's $lib alias. Used by `npm run bench` (case "section-offgrid") and by the engine's
 * tests (reuse on and off give the same bits on a demo-like recipe).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { derive, parseGef, type ParsedSounding } from '../src/lib/cpt/index';
import { cellDeclusterWeights, createRecipe, type DomainInput, type SgsRecipe, type Sample, type SearchOptions, type VariogramModel } from '../src/lib/geostat/index';
import {
	BOTTOM_ELEVATION,
	CHANNEL_AXIS,
	GROUNDWATER_ELEVATION,
	LEVEE_UNITS,
	OVERBANK_MIN_DEPTH,
	SECTION_LINE,
	unitAt,
	unitTops,
	type LeveeUnitKey
} from '../src/lib/server/scenario/levee';

const GEF_DIR = resolve(dirname(fileURLToPath(import.meta.url)), '..', 'static', 'demo', 'gef');

/** The demo's domains, in the order of its zonation "Sand split at channel". */
export const DEMO_DOMAINS = ['Overbank clay', 'Point-bar sand west', 'Point-bar sand east', 'Channel plug clay', 'Dense sand'] as const;

/** Stacking order of the demo units, top down (as demo-stratigraphy.ts). */
const STACK: LeveeUnitKey[] = ['overbank', 'plug', 'pointbar', 'dense'];
const CELL_HEIGHT = 0.2;

export interface DemoRecipeOptions {
	seed?: string;
	/** Variogram of every domain's normal scores; default exponential, sill 1, 40 m horizontal, 0.9 m vertical. */
	model?: VariogramModel;
	/** Search of every domain; default maxData 16, maxSimulated 16, maxPerSounding 8. */
	search?: SearchOptions;
	/** Grid counts along the section and in elevation; default 400 × 80 (1 m × 0.2 m from chainage 0 and elevation −12 m). */
	nx?: number;
	nz?: number;
	/** Extra fields for every domain (e.g. a path option). */
	domainExtra?: Partial<DomainInput>;
}

/** Domain index (into DEMO_DOMAINS) of a point of the section, by the scenario's units and the channel axis. */
export function demoDomainAt(chainage: number, elevation: number): number {
	const u = unitAt(chainage, elevation);
	if (u === 'overbank') return 0;
	if (u === 'pointbar') return chainage < CHANNEL_AXIS ? 1 : 2;
	if (u === 'plug') return 3;
	return 4;
}

/** Each demo domain's samples (x = chainage, y = 0, z = elevation), from the demo GEF files. */
export function demoDomainSamples(): Sample[][] {
	const out: Sample[][] = DEMO_DOMAINS.map(() => []);
	const bearing = (SECTION_LINE.bearing * Math.PI) / 180;
	const along = [Math.sin(bearing), Math.cos(bearing)];
	for (const name of readdirSync(GEF_DIR).filter((f) => f.endsWith('.gef')).sort()) {
		const [s] = parseGef(readFileSync(join(GEF_DIR, name), 'latin1'), { file: name });
		const chainage = (s.x! - SECTION_LINE.start.x) * along[0] + (s.y! - SECTION_LINE.start.y) * along[1];
		const d = derived(s, chainage);
		// Readings by domain, then averaged in windows fixed in elevation (as the app's averageInWindows).
		const windows = DEMO_DOMAINS.map(() => new Map<number, { z: number; v: number; n: number }>());
		for (let i = 0; i < d.elevation.length; i++) {
			const z = d.elevation[i];
			const dom = demoDomainAt(chainage, z);
			const value = dom === 0 || dom === 3 ? d.suRatio[i] : d.qc1Ncs[i];
			if (!Number.isFinite(value)) continue;
			if (dom === 0 && s.depth[i] < OVERBANK_MIN_DEPTH) continue;
			const k = Math.floor(z / CELL_HEIGHT + 1e-9);
			const w = windows[dom].get(k) ?? { z: 0, v: 0, n: 0 };
			w.z += z;
			w.v += value;
			w.n++;
			windows[dom].set(k, w);
		}
		windows.forEach((m, dom) => {
			for (const k of [...m.keys()].sort((a, b) => b - a)) {
				const w = m.get(k)!;
				out[dom].push({ x: chainage, y: 0, z: w.z / w.n, value: w.v / w.n, sounding: s.id });
			}
		});
	}
	return out;
}

/**
 * The demo-like recipe: five normal-score domains with simple kriging, declustered data, one model and search
 * for all (see DemoRecipeOptions), on the section grid (cells above the ground are not simulated).
 */
export function demoRecipe(options: DemoRecipeOptions = {}): SgsRecipe {
	const {
		seed = 'demo-section',
		model = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 0.9 }] },
		search = { maxData: 16, maxSimulated: 16, maxPerSounding: 8 },
		nx = 400,
		nz = 80,
		domainExtra = {}
	} = options;
	const samples = demoDomainSamples();
	const domains: DomainInput[] = samples.map((s) => ({
		samples: s,
		weights: Array.from(cellDeclusterWeights(s, { x: 40, y: 40, z: Infinity })),
		model,
		transform: 'normal-score',
		kriging: 'simple',
		search,
		...domainExtra
	}));
	const dx = 400 / nx;
	const dz = (4 - BOTTOM_ELEVATION) / nz;
	const origin = { x: dx / 2, y: 0, z: BOTTOM_ELEVATION + dz / 2 };
	const runs: [number, number][] = [];
	for (let k = 0; k < nz; k++) {
		const z = origin.z + k * dz;
		for (let i = 0; i < nx; i++) {
			const x = origin.x + i * dx;
			const dom = z > unitTops(x).overbank ? -1 : demoDomainAt(x, z);
			const last = runs[runs.length - 1];
			if (last && last[0] === dom) last[1]++;
			else runs.push([dom, 1]);
		}
	}
	return createRecipe(
		{ seed, domains },
		{ kind: 'grid', origin, spacing: { x: dx, y: 1, z: dz }, counts: { x: nx, y: 1, z: nz }, domainRuns: runs }
	);
}

/** Derived properties of one demo sounding with the demo's contacts (snapped between readings) and groundwater. */
function derived(s: ParsedSounding, chainage: number) {
	const ground = s.groundElevation!;
	const tops = unitTops(chainage);
	const elevations = Array.from(s.depth, (d) => ground - d);
	const units = STACK.filter((key) => !Number.isNaN(tops[key]))
		.map((key) => {
			const u = LEVEE_UNITS.find((l) => l.key === key)!;
			const top = key === 'overbank' ? ground : Math.min(snapBetweenReadings(tops[key], elevations), ground);
			return { topElevation: top, gammaAbove: u.gammaAbove, gammaBelow: u.gammaBelow, Nkt: u.nkt, CFC: u.cfc };
		})
		.sort((a, b) => b.topElevation - a.topElevation);
	return derive(s, { units, groundwaterElevation: GROUNDWATER_ELEVATION });
}

// As demo-stratigraphy.ts: the contact midway between the readings on either side of the scenario's contact.
function snapBetweenReadings(top: number, elevations: number[]): number {
	let above = Infinity;
	let below = -Infinity;
	for (const z of elevations) {
		if (z > top) above = Math.min(above, z);
		else below = Math.max(below, z);
	}
	if (!Number.isFinite(above) || !Number.isFinite(below)) return Math.round(top * 100) / 100;
	return Math.round(((above + below) / 2) * 1000) / 1000;
}
