import { describe, it, expect } from 'vitest';
import { PathPlan, prepareSimulation, simulatePrepared, simulate, recipeInput, targetsFromDefinition, dataReproduction, pathStream, realizationStream } from '../../../src/lib/geostat/index';
import type { PathOrder, SimulationInput, SimulationStats, TargetPoints } from '../../../src/lib/geostat/index';
import { demoRecipe } from '../../../scripts/demo-recipe';
import { block, hash, run, section, withPath } from './fixtures';

// A constant path's plan (PathPlan) must not change a single bit: realizations replayed from the plan that the
// first realization recorded against the same realizations simulated alone (simulate(), which keeps no plan), by
// the SHA-256 of their Float64 bytes. Each case also checks that the plan was replayed, so the comparison is not
// vacuous.

const CONSTANT: PathOrder[] = ['random-constant', 'multigrid-constant'];

function demo(): { input: SimulationInput; targets: TargetPoints } {
	const recipe = demoRecipe({ nx: 100, nz: 40, domainExtra: {} });
	return { input: recipeInput(recipe), targets: targetsFromDefinition(recipe.targets) };
}

function scattered(): { input: SimulationInput; targets: TargetPoints } {
	// The section's targets nudged off their lattice: the bucket search of simulated nodes, covariances evaluated.
	const { input, targets } = section();
	return { input, targets: { ...targets, x: targets.x.map((x, i) => x + (i % 3) * 1e-3) } };
}

function sectionInValues(): { input: SimulationInput; targets: TargetPoints } {
	// Simple kriging about a mean that is not 0: the estimate is mean + Σ w (v − mean), and its bits follow that form.
	const { input, targets } = section();
	return { input: { ...input, domains: input.domains.map((d) => ({ ...d, transform: 'none' as const, mean: 7.5 })) }, targets };
}

const CASES = { section, 'section in values (transform none, simple kriging about a mean of 7.5)': sectionInValues, 'block-like grid with two domains (simple and ordinary kriging, nugget)': block, 'a recipe built like the demo (data off the lattice, five domains)': demo, 'scattered targets (no lattice)': scattered };

describe('simulate on a constant path: replayed realizations have the bits of fresh ones', () => {
	for (const path of CONSTANT) {
		for (const [name, make] of Object.entries(CASES)) {
			it(`${name}, ${path}: realizations 0–3 on one prepared simulation (1–3 replayed from the plan) have the SHA-256 of each simulated alone`, () => {
				const { input, targets } = make();
				const constant = withPath(input, path);
				const prep = prepareSimulation(constant, targets);
				const planned = prep.domains.filter((d) => d.pathNodes.length > 0);
				expect(planned.every((d) => d.plan !== null && d.plan.steps === d.pathNodes.length)).toBe(true);
				const stats: SimulationStats = { systems: 0, neighbours: 0, reused: 0, replayed: 0 };
				const hashes = [hash(simulatePrepared(prep, 0, undefined, stats))];
				const solved = stats.systems;
				for (let r = 1; r < 4; r++) hashes.push(hash(simulatePrepared(prep, r, undefined, stats)));
				// Realizations 1–3 solved no system: every step came from the plan.
				expect(stats.systems).toBe(solved);
				expect(stats.replayed).toBe(3 * solved);
				expect(planned.every((d) => d.plan!.recorded === d.pathNodes.length)).toBe(true);
				const alone = [0, 1, 2, 3].map((r) => hash(simulate(constant, targets, r)));
				expect(hashes).toEqual(alone);
				expect(new Set(hashes).size).toBe(4);
			});
		}
	}

	it('a plan that holds only the first part of the path (little memory): the rest is solved, with the same bits', () => {
		const { input, targets } = section();
		const constant = withPath(input, 'random-constant');
		const full = prepareSimulation(constant, targets).domains[0].plan!;
		const reuseBytes = Math.floor(full.steps / 3) * (12 + 12 * full.kmax) + 4;
		const prep = prepareSimulation(constant, targets, { reuseBytes });
		const plan = prep.domains[0].plan!;
		// As many steps as fit in three quarters of the memory.
		expect(PathPlan.bytes(plan.steps, plan.kmax)).toBeLessThanOrEqual(0.75 * reuseBytes);
		expect(PathPlan.bytes(plan.steps + 1, plan.kmax)).toBeGreaterThan(0.75 * reuseBytes);
		expect(plan.steps).toBeGreaterThan(0);
		expect(plan.steps).toBeLessThan(prep.domains[0].pathNodes.length / 2);
		const stats: SimulationStats = { systems: 0, neighbours: 0, reused: 0, replayed: 0 };
		const hashes = [0, 1, 2].map((r) => hash(simulatePrepared(prep, r, undefined, stats)));
		expect(plan.recorded).toBe(plan.steps);
		// The plan's steps were solved once; the others in each realization.
		const steps = prep.domains[0].pathNodes.length;
		expect(stats.systems).toBe(steps + 2 * (steps - plan.steps));
		expect(stats.replayed).toBe(2 * plan.steps);
		expect(hashes).toEqual([0, 1, 2].map((r) => hash(simulate(constant, targets, r))));
	});

	it('a realization stopped half-way (its progress callback throws) leaves a plan that the next realizations continue, with the same bits', () => {
		const { input, targets } = demo();
		const constant = withPath(input, 'random-constant');
		const prep = prepareSimulation(constant, targets);
		expect(() =>
			simulatePrepared(prep, 0, (done, total) => {
				if (done > total / 2) throw new Error('stop');
			})
		).toThrow('stop');
		const partly = prep.domains.map((d) => (d.plan ? d.plan.recorded : 0));
		expect(partly.some((n, i) => n > 0 && n < prep.domains[i].pathNodes.length)).toBe(true);
		const hashes = [1, 0, 2].map((r) => hash(simulatePrepared(prep, r)));
		expect(hashes).toEqual([1, 0, 2].map((r) => hash(simulate(constant, targets, r))));
	});

	it('one realization alone (simulate, keepPerTarget false) keeps no plan; reuseBytes 0 keeps none, with the same bits', () => {
		const { input, targets } = section();
		const constant = withPath(input, 'multigrid-constant');
		expect(prepareSimulation(constant, targets, { keepPerTarget: false }).domains[0].plan).toBeNull();
		const none = run(constant, targets, 2, { reuseBytes: 0 });
		expect(none.prep.domains[0].plan).toBeNull();
		expect(none.hashes).toEqual(run(constant, targets, 2, {}).hashes);
	});
});

describe('the constant path itself', () => {
	it('pathStream(seed, d) repeats, differs between domains and seeds, and from every realization stream', () => {
		const draw = (f: () => number) => Array.from({ length: 5 }, f);
		expect(draw(pathStream('s', 0))).toEqual(draw(pathStream('s', 0)));
		expect(draw(pathStream('s', 0))).not.toEqual(draw(pathStream('s', 1)));
		expect(draw(pathStream('s', 0))).not.toEqual(draw(pathStream('t', 0)));
		for (let r = 0; r < 3; r++) expect(draw(pathStream('s', 0))).not.toEqual(draw(realizationStream('s', r, 0)));
	});

	it('one path for every realization, the same in another prepared simulation, and not the per-realization path', () => {
		const { input, targets } = section();
		const a = prepareSimulation(withPath(input, 'random-constant'), targets);
		simulatePrepared(a, 0);
		const path = Array.from(a.domains[0].plan!.path!);
		simulatePrepared(a, 5);
		expect(Array.from(a.domains[0].plan!.path!)).toEqual(path);
		const b = prepareSimulation(withPath(input, 'random-constant'), targets);
		simulatePrepared(b, 3);
		expect(Array.from(b.domains[0].plan!.path!)).toEqual(path);
		// A permutation of the domain's path nodes.
		expect([...path].sort((x, y) => x - y)).toEqual(path.map((_, i) => i));
		// The realizations differ from those of a path drawn per realization (other deviates, other path).
		expect(hash(simulate(withPath(input, 'random-constant'), targets, 0))).not.toBe(hash(simulate(input, targets, 0)));
	});

	it('realizations on a constant path honour the data exactly', () => {
		const { input, targets } = section();
		const prep = prepareSimulation(withPath(input, 'multigrid-constant'), targets);
		for (let r = 0; r < 3; r++) {
			const rep = dataReproduction(simulatePrepared(prep, r), targets, input.domains[0].samples);
			expect(rep).toEqual({ maxError: 0, count: 320 });
		}
	});
});
