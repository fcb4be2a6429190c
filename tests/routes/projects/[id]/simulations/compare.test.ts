// The Compare page's pure helpers: the grid refusal, the zone boundaries where zonations split a unit
// differently, each domain's figures over the ensemble maps, and the difference on a scale centred on zero.
import { describe, expect, it } from 'vitest';
import { createUniformRecipe, weightedMean, weightedQuantiles, type Recipe } from '../../../../../src/lib/geostat/index';
import { expectAbsClose } from '../../../../asserts';
import type { ZonationView, ZoneBoundaryView } from '../../../../../src/lib/api/index';
import { boundariesWhereZonationsDiffer, difference, domainFigures, gridRefusal, symmetricSpan } from '../../../../../src/routes/projects/[id]/simulations/compare/compare';

const grid = (cell: number) => ({ kind: 'grid' as const, origin: { x: cell / 2, y: 0, z: 0.5 }, spacing: { x: cell, y: 1, z: 1 }, counts: { x: 4 / cell, y: 1, z: 2 }, domainRuns: [[0, 8 / cell] as [number, number]] });
const uniform = (cell: number): Recipe => createUniformRecipe([50], [{ samples: [1, 2, 4].map((value, i) => ({ x: i, y: 0, z: 1, value })), weights: [1, 1, 2] }], grid(cell));

describe('gridRefusal(recipes)', () => {
	it('gridRefusal is null for recipes on one grid and names both grids otherwise', () => {
		expect(gridRefusal([{ name: 'A', recipe: uniform(1) }, { name: 'B', recipe: uniform(1) }], 'm')).toBeNull();
		const msg = gridRefusal([{ name: 'A', recipe: uniform(1) }, { name: 'B', recipe: uniform(2) }], 'm');
		expect(msg).toBe(
			'A is on a grid of 4 × 2 cells of 1 × 1 m from (0.5, 0, 0.5); B on 2 × 2 cells of 2 × 1 m from (1, 0, 0.5). Recipes compared cell by cell must share a grid: make one again on the other’s grid (“Change as a new recipe”).'
		);
	});
});

describe('boundariesWhereZonationsDiffer(zonations, boundaries)', () => {
	const z = (id: string, domains: { id: string; members: { unitId: string; zone: number }[] }[]) => ({ id, name: id, description: '', domains }) as unknown as ZonationView;
	const split = z('split', [
		{ id: 'w', members: [{ unitId: 'sand', zone: 0 }] },
		{ id: 'e', members: [{ unitId: 'sand', zone: 1 }] },
		{ id: 'c', members: [{ unitId: 'clay', zone: -1 }] }
	]);
	const grouped = z('grouped', [
		{ id: 's', members: [{ unitId: 'sand', zone: -1 }] },
		{ id: 'c', members: [{ unitId: 'clay', zone: -1 }] }
	]);
	const zonesTogether = z('together', [{ id: 's', members: [{ unitId: 'sand', zone: 0 }, { unitId: 'sand', zone: 1 }] }]);
	const b = (id: string, unitId: string) => ({ id, unitId, chainageTop: 1, elevationTop: 0, chainageBottom: 1, elevationBottom: -1 }) as ZoneBoundaryView;
	const boundaries = [b('b-sand', 'sand'), b('b-clay', 'clay')];

	it('draws the boundary of a unit one zonation splits and another does not; nothing when they agree or one is unknown', () => {
		expect(boundariesWhereZonationsDiffer([split, grouped], boundaries).map((x) => x.id)).toEqual(['b-sand']);
		expect(boundariesWhereZonationsDiffer([split, zonesTogether], boundaries).map((x) => x.id)).toEqual(['b-sand']);
		expect(boundariesWhereZonationsDiffer([grouped, zonesTogether], boundaries)).toEqual([]);
		expect(boundariesWhereZonationsDiffer([split, split], boundaries)).toEqual([]);
		expect(boundariesWhereZonationsDiffer([split, undefined], boundaries)).toEqual([]);
	});
});

describe('domainFigures / difference / symmetricSpan', () => {
	it('domainFigures averages the maps over each domain’s cells and takes the data’s declustered mean and P50', () => {
		const r = uniform(1);
		const domainOf = Int32Array.from([0, 0, 0, -1, 0, 0, 0, -1]);
		const mean = Float64Array.from([1, 2, 3, NaN, 4, 5, 6, NaN]);
		const sd = new Float64Array(8).fill(0.5);
		const below = Float64Array.from([0, 1, 1, NaN, 0, 0, 1, NaN]);
		const [f] = domainFigures(r, domainOf, { mean, sd, below });
		expect(f.cells).toBe(6);
		expect(f.etype).toBe(21 / 6);
		expect(f.sd).toBe(0.5);
		expect(f.below).toBe(0.5);
		expect(f.data).toEqual({ n: 3, mean: weightedMean([1, 2, 4], [1, 1, 2]), p50: weightedQuantiles([1, 2, 4], [1, 1, 2], [0.5])[0] });
		// Positions 0.125, 0.375, 0.75: P50 lies a third of the way from 2 to 4.
		expectAbsClose(f.data.p50, 2 + 2 / 3, 1e-12);
	});

	it('difference is b − a cell by cell (NaN propagates); symmetricSpan is the largest |value| among the kept cells', () => {
		const d = difference([1, 2, NaN], [4, 1, 3]);
		expect(Array.from(d)).toEqual([3, -1, NaN]);
		expect(symmetricSpan(d, () => true)).toBe(3);
		expect(symmetricSpan(d, (c) => c === 1)).toBe(1);
		expect(symmetricSpan([0, 0], () => true)).toBe(1);
	});
});
