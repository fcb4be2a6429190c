import seedrandom from 'seedrandom';
import { weakZones } from '../src/lib/ensemble/index';
import type { BenchCase } from './index';

/**
 * Fields for the labelling: a moving sum of uniform deviates along x (a lens-like lateral correlation of about
 * `run` cells), one a realization, thresholded near the 35th percentile so weak cells percolate in places.
 */
function fields(nx: number, ny: number, nz: number, n: number, run: number, seed: string): Float64Array[] {
	const rng = seedrandom(seed);
	return Array.from({ length: n }, () => {
		const v = new Float64Array(nx * ny * nz);
		for (let row = 0; row < ny * nz; row++) {
			let sum = 0;
			const noise = Float64Array.from({ length: nx + run }, () => rng());
			for (let i = 0; i < run; i++) sum += noise[i];
			for (let i = 0; i < nx; i++) {
				v[row * nx + i] = (sum / run) * 200;
				sum += noise[i + run] - noise[i];
			}
		}
		return v;
	});
}

function timed(name: string, counts: { x: number; y: number; z: number }, n: number): BenchCase {
	return {
		name,
		run() {
			const cells = counts.x * counts.y * counts.z;
			const realizations = fields(counts.x, counts.y, counts.z, n, 20, name);
			const grid = { counts, spacing: { x: 1, y: 1, z: 0.2 } };
			const opts = { threshold: 93, eligible: new Uint8Array(cells).fill(1), minLength: 20, side: Int8Array.from({ length: cells }, (_, c) => ((c % counts.x) * 2 >= counts.x ? 1 : 0)) };
			weakZones(realizations.slice(0, 1), grid, opts); // warm-up
			const times: number[] = [];
			let zones = 0;
			for (let k = 0; k < 3; k++) {
				const t0 = performance.now();
				const s = weakZones(realizations, grid, opts);
				times.push(performance.now() - t0);
				zones = s.realizations.reduce((a, r) => a + r.zones, 0);
			}
			times.sort((a, b) => a - b);
			const ms = times[1];
			return { ms: Math.round(ms * 10) / 10, cells: cells * n, zones, cellsPerSecond: Math.round((cells * n) / (ms / 1000)) };
		}
	};
}

/** The demo's grid (400 × 85 cells in a section, 20 realizations) and a block (100 × 50 × 40, 5 realizations). */
export default [timed('weak-zones-section-20', { x: 400, y: 1, z: 85 }, 20), timed('weak-zones-block-5', { x: 100, y: 50, z: 40 }, 5)];
