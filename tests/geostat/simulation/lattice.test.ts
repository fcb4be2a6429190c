import { describe, it, expect } from 'vitest';
import { detectLattice, targetsFromDefinition } from '../../../src/lib/geostat/index';
import type { TargetPoints } from '../../../src/lib/geostat/index';

const grid = (): TargetPoints =>
	targetsFromDefinition({ kind: 'grid', origin: { x: 10, y: -5, z: -3 }, spacing: { x: 0.5, y: 2, z: 0.1 }, counts: { x: 7, y: 3, z: 11 }, domainRuns: [[0, 231]] });

describe('detectLattice(targets)', () => {
	it('detectLattice recognises a grid: origin, spacing (within 1e-15 relative), counts, and cell ↔ target maps', () => {
		const t = grid();
		const l = detectLattice(t)!;
		expect(l.origin).toEqual([10, -5, -3]);
		expect(l.counts).toEqual([7, 3, 11]);
		l.spacing.forEach((s, a) => expect(Math.abs(s - [0.5, 2, 0.1][a])).toBeLessThan(1e-15 * 2));
		for (let i = 0; i < t.x.length; i++) expect(l.cell[l.cellOf[i]]).toBe(i);
	});

	it('detectLattice returns null for jittered points, duplicate points or a sparse box; a single target is a 1-cell lattice', () => {
		const j = grid();
		j.x[5] += 1e-4;
		expect(detectLattice(j)).toBeNull();
		const d = grid();
		d.x[1] = d.x[0];
		expect(detectLattice(d)).toBeNull();
		const sparse: TargetPoints = { x: new Float64Array([0, 1, 5000]), y: new Float64Array(3), z: new Float64Array(3), domain: new Int32Array(3) };
		expect(detectLattice(sparse)).toBeNull();
		const one: TargetPoints = { x: new Float64Array([3]), y: new Float64Array([4]), z: new Float64Array([5]), domain: new Int32Array(1) };
		expect(detectLattice(one)!.counts).toEqual([1, 1, 1]);
	});

	it('detectLattice ignores targets at domain −1 and returns null when there are none', () => {
		const t = grid();
		t.domain.fill(-1);
		expect(detectLattice(t)).toBeNull();
		// Active: all but the first z level (21 targets); the lattice is the active box.
		for (let i = 21; i < 231; i++) t.domain[i] = 0;
		const l = detectLattice(t)!;
		expect(l.counts).toEqual([7, 3, 10]);
		expect(l.cellOf[5]).toBe(-1);
		expect(l.cell[0]).toBe(21);
	});
});
