/**
 * Off-lattice simulations whose realizations are pinned by SHA-256 (offlattice-bits.test.ts): scattered points in
 * 2D and 3D, a non-uniform section, several domains, simple and ordinary kriging, searches that fill up and
 * searches the radius limits. Made with seedrandom so the cases are the same everywhere.
 */
import seedrandom from 'seedrandom';
import type { SimulationInput, TargetPoints } from '../../../src/lib/geostat/index';

export interface OffLatticeCase {
	name: string;
	input: SimulationInput;
	targets: TargetPoints;
	realizations: number[];
}

function samples(rand: () => number, soundings: number, perSounding: number, box: [number, number, number, number, number, number], threeD: boolean) {
	const [x0, x1, y0, y1, z0, z1] = box;
	const out: { x: number; y: number; z: number; value: number; sounding: string }[] = [];
	for (let s = 0; s < soundings; s++) {
		const x = x0 + rand() * (x1 - x0);
		const y = threeD ? y0 + rand() * (y1 - y0) : 0;
		for (let k = 0; k < perSounding; k++) {
			const z = z0 + ((k + rand()) / perSounding) * (z1 - z0);
			out.push({ x, y, z, value: 40 + 60 * rand() + 0.5 * z, sounding: `S${s}` });
		}
	}
	return out;
}

function scattered(rand: () => number, n: number, box: [number, number, number, number, number, number], threeD: boolean, domains: number): TargetPoints {
	const [x0, x1, y0, y1, z0, z1] = box;
	const x = new Float64Array(n);
	const y = new Float64Array(n);
	const z = new Float64Array(n);
	const domain = new Int32Array(n);
	for (let i = 0; i < n; i++) {
		x[i] = x0 + rand() * (x1 - x0);
		y[i] = threeD ? y0 + rand() * (y1 - y0) : 0;
		z[i] = z0 + rand() * (z1 - z0);
		domain[i] = domains === 1 ? 0 : x[i] < (x0 + x1) / 2 ? 0 : rand() < 0.02 ? -1 : 1;
	}
	return { x, y, z, domain };
}

/** A section of variable cell heights: 0.25 m cells above −4 m, 1 m below, columns 2 m wide. */
function section(): TargetPoints {
	const zs: number[] = [];
	for (let z = -11.5; z < -4; z += 1) zs.push(z);
	for (let z = -3.875; z < 0; z += 0.25) zs.push(z);
	const cols = 60;
	const n = cols * zs.length;
	const t = { x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n), domain: new Int32Array(n) };
	let p = 0;
	for (const z of zs) {
		for (let c = 0; c < cols; c++, p++) {
			t.x[p] = 1 + 2 * c;
			t.z[p] = z;
			t.domain[p] = z < -4 ? 1 : 0;
		}
	}
	return t;
}

export function offLatticeCases(): OffLatticeCase[] {
	const rand = seedrandom('off-lattice-cases');
	const box2: [number, number, number, number, number, number] = [0, 120, 0, 0, -12, 0];
	const box3: [number, number, number, number, number, number] = [0, 60, 0, 40, -8, 0];
	const exp = (rangeMajor: number, rangeMinor: number, rangeVertical: number, azimuth = 90) => ({
		azimuth,
		structures: [{ type: 'exponential' as const, sill: 1, rangeMajor, rangeMinor, rangeVertical }]
	});
	return [
		{
			name: 'scattered 2D, two domains, a full search',
			input: {
				seed: 'off-2d',
				domains: [
					{ samples: samples(rand, 6, 20, box2, false), model: exp(30, Infinity, 1.5), transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 16, maxPerSounding: 4 } },
					{ samples: samples(rand, 6, 20, box2, false), model: exp(20, Infinity, 2), transform: 'normal-score', kriging: 'ordinary', search: { maxData: 8, maxSimulated: 12 } }
				]
			},
			targets: scattered(rand, 5000, box2, false, 2),
			realizations: [0, 1]
		},
		{
			name: 'scattered 3D, anisotropic in plan',
			input: {
				seed: 'off-3d',
				domains: [{ samples: samples(rand, 8, 12, box3, true), model: exp(25, 10, 1.2, 30), transform: 'normal-score', kriging: 'simple', search: { maxData: 10, maxSimulated: 20, maxPerSounding: 5 } }]
			},
			targets: scattered(rand, 6000, box3, true, 1),
			realizations: [0, 2]
		},
		{
			name: 'scattered 2D, a small radius that leaves systems short of nodes',
			input: {
				seed: 'off-sparse',
				domains: [{ samples: samples(rand, 3, 10, box2, false), model: exp(3, Infinity, 0.3), transform: 'normal-score', kriging: 'simple', search: { maxData: 4, maxSimulated: 40, radius: { major: 3, minor: 3, vertical: 0.3 } } }]
			},
			targets: scattered(rand, 3000, box2, false, 1),
			realizations: [0]
		},
		{
			name: 'a section of variable cell heights, two domains',
			input: {
				seed: 'off-section',
				domains: [
					{ samples: samples(rand, 5, 16, [0, 120, 0, 0, -4, 0], false), model: exp(40, Infinity, 0.9), transform: 'normal-score', kriging: 'simple', search: { maxData: 16, maxSimulated: 16, maxPerSounding: 8 } },
					{ samples: samples(rand, 5, 8, [0, 120, 0, 0, -12, -4], false), model: exp(25, Infinity, 1.5), transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 12 } }
				]
			},
			targets: section(),
			realizations: [0, 5]
		}
	];
}
