import { describe, it, expect } from 'vitest';
import { prepareSimulation, simulatePrepared, simulate, recipeInput, targetsFromDefinition, dataReproduction } from '../../../src/lib/geostat/index';
import type { Sample, SimulationInput, VariogramModel } from '../../../src/lib/geostat/index';
import { demoRecipe } from '../../../scripts/demo-recipe';
import { block, grid, hash, run, section, soundings, withPath } from './fixtures';

// Reuse (issue 16) must not change a single bit: realizations with everything kept and reused (solved kriging
// systems, data searches, data covariances) against the same realizations computed afresh, by the SHA-256 of
// their Float64 bytes. Each case also checks that reuse really happened, so the comparison is not vacuous.

describe('simulate with reuse on and off (same bits)', () => {
	for (const path of ['random', 'multigrid'] as const) {
		it(`section, ${path} path: SHA-256 of realizations 0–2 are equal with reuse on and off, and systems were reused`, () => {
			const { input, targets } = section();
			const on = run(withPath(input, path), targets, 3, {});
			const off = run(withPath(input, path), targets, 3, { reuseBytes: 0 });
			expect(on.hashes).toEqual(off.hashes);
			expect(new Set(on.hashes).size).toBe(3);
			expect(off.stats.reused).toBe(0);
			expect(on.stats.reused).toBeGreaterThan(0.05 * on.stats.systems);
			expect(on.stats.neighbours).toBe(off.stats.neighbours);
		});

		it(`section and block-like grid, ${path} path: data parts kept by their offsets alone (no solutions reused) give the same SHA-256 as nothing kept, and were reused`, () => {
			for (const { input, targets } of [section(), block()]) {
				const parts = run(withPath(input, path), targets, 2, { reuseSolutions: false });
				const fresh = run(withPath(input, path), targets, 2, { reuseBytes: 0 });
				expect(parts.hashes).toEqual(fresh.hashes);
				expect(parts.prep.cache).toBeNull();
				expect(fresh.prep.parts).toBeNull();
				// Most systems find their data part already factored: the data's offsets repeat along the lattice.
				expect(parts.prep.parts!.hits).toBeGreaterThan(0.5 * parts.stats.systems);
			}
		});

		it(`block-like grid with two domains (simple and ordinary kriging, nugget, rotated anisotropy), ${path} path: same SHA-256 with reuse on and off`, () => {
			const { input, targets } = block();
			const on = run(withPath(input, path), targets, 2, {});
			const off = run(withPath(input, path), targets, 2, { reuseBytes: 0 });
			expect(on.hashes).toEqual(off.hashes);
			expect(on.stats.reused).toBeGreaterThan(0);
		});

		it(`a recipe built like the demo's (demo soundings, five domains, data off the lattice), ${path} path: same SHA-256 with reuse on and off`, () => {
			const recipe = demoRecipe({ nx: 100, nz: 40, domainExtra: {} });
			const input = withPath(recipeInput(recipe), path);
			const targets = targetsFromDefinition(recipe.targets);
			const on = run(input, targets, 2, {});
			const off = run(input, targets, 2, { reuseBytes: 0 });
			expect(on.hashes).toEqual(off.hashes);
			// Data off the lattice: hardly a signature is reusable — only where every neighbour of a node is a lattice node,
			// as in the overbank clay's crust, which the demo's rule leaves without data (under 1 % of the systems) — but
			// the kept data searches and covariances were used.
			expect(on.stats.reused).toBeLessThan(0.01 * on.stats.systems);
			const kept = on.prep.domains.filter((d) => d.dataCov !== null && d.dataCov.some((c) => !Number.isNaN(c)));
			expect(kept.length).toBe(5);
			expect(on.prep.domains.every((d) => d.dataSelection !== null && d.dataSelection[0] >= 0)).toBe(true);
		});
	}

	it('on a random path only the last 30 % of each path looks solved systems up (earlier neighbourhoods hardly repeat); a multiple-grid path whose neighbourhoods repeat looks up most systems', () => {
		const { input, targets } = section();
		const random = run(withPath(input, 'random'), targets, 1, { keepPerTarget: false });
		const cache = random.prep.cache!;
		// A lookup is a hit or a store: at most the systems of the path's last 30 % (fewer while hits stay rare).
		expect(cache.hits + cache.stores).toBeLessThanOrEqual(Math.ceil(0.3 * random.stats.systems) + 1);
		expect(cache.hits).toBeGreaterThan(0);
		const multigrid = run(withPath(input, 'multigrid'), targets, 1, { keepPerTarget: false });
		// From the start, and on most systems while hits keep coming (measured: 62 % looked up, 16 % hits).
		expect(multigrid.prep.cache!.hits + multigrid.prep.cache!.stores).toBeGreaterThan(0.5 * multigrid.stats.systems);
		expect(multigrid.prep.cache!.hits).toBeGreaterThan(0.1 * multigrid.stats.systems);
	});

	it('where neighbourhoods hardly repeat (a block whose every system holds data), lookups fall to about one system in 16, with the same bits', () => {
		const { targets } = block();
		const samples = soundings([[10, 10], [36, 12], [14, 34], [38, 40]], 12, 0.25);
		const model: VariogramModel = { azimuth: 30, structures: [{ type: 'exponential', sill: 1, rangeMajor: 24, rangeMinor: 16, rangeVertical: 1.5 }] };
		const input: SimulationInput = { seed: 'probe', domains: [{ samples, model, transform: 'normal-score', kriging: 'simple', search: { maxData: 12, maxSimulated: 16, path: 'multigrid' } }] };
		targets.domain.fill(0);
		const on = run(input, targets, 1, { keepPerTarget: false });
		const cache = on.prep.cache!;
		expect(cache.hits + cache.stores).toBeLessThan(0.15 * on.stats.systems);
		expect(cache.stores).toBeGreaterThan(0.0625 * on.stats.systems * 0.9);
		expect(on.hashes).toEqual(run(input, targets, 1, { reuseBytes: 0 }).hashes);
	});

	it('a cache of a few slots (constant eviction) still gives the same bits, and realization 2 regenerated alone equals realization 2 after a warm cache', () => {
		const { input, targets } = section();
		const tiny = run(input, targets, 3, { reuseBytes: 20_000 });
		expect(tiny.prep.cache!.slots).toBeLessThan(64);
		const off = run(input, targets, 3, { reuseBytes: 0 });
		expect(tiny.hashes).toEqual(off.hashes);
		expect(tiny.stats.reused).toBeGreaterThan(0);
		expect(hash(simulate(input, targets, 2))).toBe(off.hashes[2]);
	});

	it('a Gaussian model without nugget and data off the grid 2e-6 apart (systems rescued by the ridge): same SHA-256 with reuse on and off', () => {
		const targets = grid(60, 1, 8, 1, 1, 0.5);
		const samples: Sample[] = [
			{ x: 5.3, y: 0, z: -1.1, value: 1, sounding: 'A' },
			{ x: 5.300002, y: 0, z: -1.1, value: 1.1, sounding: 'A' },
			{ x: 20.7, y: 0, z: -2.05, value: -0.4, sounding: 'B' },
			{ x: 33.2, y: 0, z: -0.3, value: 0.6, sounding: 'C' }
		];
		const model: VariogramModel = { azimuth: 90, structures: [{ type: 'gaussian', sill: 1, rangeMajor: 30, rangeMinor: 30, rangeVertical: 3 }] };
		const input: SimulationInput = { seed: 'ridge', domains: [{ samples, model, transform: 'none', kriging: 'ordinary', search: { maxData: 4, maxSimulated: 8 } }] };
		const on = run(input, targets, 3, {});
		const off = run(input, targets, 3, { reuseBytes: 0 });
		expect(on.hashes).toEqual(off.hashes);
		expect(on.prep.domains[0].dataFactorReady!.some((r) => r === 1)).toBe(true);
	});

	it('reuse keeps realizations honouring the data exactly', () => {
		const { input, targets } = section();
		const prep = prepareSimulation(withPath(input, 'multigrid'), targets);
		for (let r = 0; r < 2; r++) {
			const rep = dataReproduction(simulatePrepared(prep, r), targets, input.domains[0].samples);
			expect(rep.count).toBe(320);
			expect(rep.maxError).toBe(0);
		}
	});

	it('prepareSimulation rejects a negative or NaN reuseBytes; reuseBytes 0 keeps nothing; reuseSolutions false keeps only the data parts', () => {
		const { input, targets } = section();
		expect(() => prepareSimulation(input, targets, { reuseBytes: -1 })).toThrow(RangeError);
		expect(() => prepareSimulation(input, targets, { reuseBytes: NaN })).toThrow(RangeError);
		const none = prepareSimulation(input, targets, { reuseBytes: 0 });
		expect(none.cache).toBeNull();
		expect(none.domains[0].dataSelection).toBeNull();
		const data = prepareSimulation(input, targets, { reuseSolutions: false });
		expect(data.cache).toBeNull();
		expect(data.domains[0].dataSelection).not.toBeNull();
		// Data on the lattice: their covariances come from the table, so neither data covariances nor factors are kept.
		expect(data.domains[0].dataCov).toBeNull();
		expect(data.domains[0].dataFactor).toBeNull();
		// One realization (simulate()): nothing kept per target.
		const recipe = demoRecipe({ nx: 40, nz: 20 });
		const one = prepareSimulation(recipeInput(recipe), targetsFromDefinition(recipe.targets), { keepPerTarget: false });
		expect(one.domains.every((d) => d.dataSelection === null && d.dataFactor === null)).toBe(true);
		expect(one.domains.some((d) => d.dataCov !== null)).toBe(true);
		// Scattered targets have no lattice, so no signature: no cache either.
		const scattered = { ...targets, x: targets.x.map((x, i) => x + (i % 3) * 1e-3) };
		expect(prepareSimulation(input, scattered).cache).toBeNull();
	});
});
