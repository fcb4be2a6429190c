// Inputs shared by the tests of reuse (simulate-reuse) and of the constant path (constant-path): lattices, soundings
// with readings on them, and runs of several realizations on one prepared simulation hashed by SHA-256.
import { prepareSimulation, simulatePrepared, sha256 } from '../../../src/lib/geostat/index';
import type { PathOrder, PrepareOptions, Sample, SimulationInput, SimulationStats, TargetPoints, VariogramModel } from '../../../src/lib/geostat/index';

export function hash(v: Float64Array): string {
	return sha256(new Uint8Array(v.buffer, v.byteOffset, v.byteLength));
}

export function grid(nx: number, ny: number, nz: number, dx: number, dy: number, dz: number): TargetPoints {
	const n = nx * ny * nz;
	const t: TargetPoints = { x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n), domain: new Int32Array(n) };
	let p = 0;
	for (let k = 0; k < nz; k++) {
		for (let j = 0; j < ny; j++) {
			for (let i = 0; i < nx; i++, p++) {
				t.x[p] = i * dx;
				t.y[p] = j * dy;
				t.z[p] = -k * dz;
			}
		}
	}
	return t;
}

/** Soundings at plan positions, a reading every `step` m from the top (on the lattice when step is the cell height). */
export function soundings(plan: [number, number][], readings: number, step: number): Sample[] {
	const out: Sample[] = [];
	plan.forEach(([x, y], s) => {
		for (let k = 0; k < readings; k++) out.push({ x, y, z: -k * step, value: 5 + ((s * 7 + k * 13) % 11) + 0.1 * k, sounding: `S${s}` });
	});
	return out;
}

export function withPath(input: SimulationInput, path: PathOrder): SimulationInput {
	return { ...input, domains: input.domains.map((d) => ({ ...d, search: { ...d.search, path } })) };
}

/** Hashes of realizations 0…n−1 run one after another on one prepared simulation, and its counters. */
export function run(input: SimulationInput, targets: TargetPoints, n: number, options: PrepareOptions) {
	const prep = prepareSimulation(input, targets, options);
	const stats: SimulationStats = { systems: 0, neighbours: 0, reused: 0, replayed: 0 };
	const hashes = Array.from({ length: n }, (_, r) => hash(simulatePrepared(prep, r, undefined, stats)));
	return { hashes, stats, prep };
}

export const section = (): { input: SimulationInput; targets: TargetPoints } => {
	// 100 m × 10 m at 1 × 0.25 m, 8 soundings with readings on the lattice: on-lattice data enter signatures.
	const targets = grid(100, 1, 40, 1, 1, 0.25);
	const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 40, rangeMinor: 40, rangeVertical: 1 }] };
	const samples = soundings(Array.from({ length: 8 }, (_, b) => [6 + 12 * b, 0] as [number, number]), 40, 0.25);
	return { targets, input: { seed: 'reuse-section', domains: [{ samples, model, transform: 'normal-score', kriging: 'simple', search: { maxData: 16, maxSimulated: 16 } }] } };
};

export const block = (): { input: SimulationInput; targets: TargetPoints } => {
	// 24 × 24 × 12 at 2 × 2 × 0.25 m, 4 soundings; a second domain (the bottom quarter) with ordinary kriging.
	const targets = grid(24, 24, 12, 2, 2, 0.25);
	for (let i = 0; i < targets.z.length; i++) targets.domain[i] = targets.z[i] < -2 ? 1 : 0;
	const model: VariogramModel = { azimuth: 30, structures: [{ type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 }, { type: 'exponential', sill: 0.9, rangeMajor: 24, rangeMinor: 16, rangeVertical: 1.5 }] };
	const samples = soundings([[10, 10], [36, 12], [14, 34], [38, 40]], 12, 0.25);
	return {
		targets,
		input: {
			seed: 'reuse-block',
			domains: [
				{ samples: samples.filter((s) => s.z >= -2), model, transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 16, maxPerSounding: 4 } },
				{ samples: samples.filter((s) => s.z < -2), model, transform: 'none', mean: 8, kriging: 'ordinary', search: { maxData: 8, maxSimulated: 12 } }
			]
		}
	};
};

