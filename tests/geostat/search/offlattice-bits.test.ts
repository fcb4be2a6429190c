/**
 * Off-lattice realizations keep their bits under the nearest-first search of simulated nodes (ActiveBuckets): the
 * SHA-256 of each realization below was computed with the engine before that search replaced the scan of every
 * target in the ellipsoid (main at 9811a71, ENGINE_VERSION conefield-sgs/3), so a recipe on a mesh or a grid of
 * variable cell heights regenerates exactly as it did. The cases are in offlattice-cases.ts.
 */
import { describe, expect, it } from 'vitest';
import { sha256, simulate } from '../../../src/lib/geostat/index';
import { offLatticeCases } from './offlattice-cases';

const PINNED: [string, number, string][] = [
	['scattered 2D, two domains, a full search', 0, '017efe22f70702a170a446359bc2c92d15c6a9ffa2eedb283ef8ef4b2d9910c2'],
	['scattered 2D, two domains, a full search', 1, '774a942ca2defade5131fe021296950e560bccfdc67e5e1c17518f60d87a6e78'],
	['scattered 3D, anisotropic in plan', 0, 'c8d46f921c5e6167ec5e55d1a7e81fb3b4d3ded8b749f2e648cb4b57e136858a'],
	['scattered 3D, anisotropic in plan', 2, '8b7a032900edd4ffa9d00a27d474fa9f696791c55bfa49b0f25f168e4c5880ef'],
	['scattered 2D, a small radius that leaves systems short of nodes', 0, '363f3ad5be3fad7d8099c719390bb4c2fcb396749b9ed55211c817ecb0b73ff6'],
	['a section of variable cell heights, two domains', 0, 'ba90ca76fe43bd0d08455d22cd9f51a6cde57d9ecb9a047f3e8101b9989a0240'],
	['a section of variable cell heights, two domains', 5, '2250cb9484bd5f8bae7fdd1ede074ac2d7277269968d000387851ff6e924e28d'],
];

describe('off-lattice realizations (pinned SHA-256 from before the nearest-first search)', () => {
	const cases = offLatticeCases();
	it.each(PINNED)('%s, realization %i', (name, r, hash) => {
		const c = cases.find((x) => x.name === name)!;
		const values = simulate(c.input, c.targets, r);
		expect(sha256(new Uint8Array(values.buffer, values.byteOffset, values.byteLength))).toBe(hash);
	});
});
