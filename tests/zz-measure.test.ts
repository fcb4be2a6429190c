import { it } from 'vitest';
import { openDatabase } from '../src/lib/server/db';
import { seedDemo } from '../src/lib/server/services/demo';
import { getRecipe, listRecipes, loadRecipe } from '../src/lib/server/services/recipes';
import { recipeWeakZonesOf } from '../src/lib/server/services/weak-zones';
import { stopRealizations } from '../src/lib/server/realizations';
import { expandRuns } from '../src/lib/plots/raster';

it('measure east', async () => {
	const db = openDatabase(':memory:');
	const pid = (await seedDemo(db))!;
	const out: string[] = [];
	for (const r of listRecipes(pid, db).filter((x) => x.kind === 'sgs')) {
		const view = getRecipe(pid, r.id, db);
		const { recipe } = loadRecipe(pid, r.id, db);
		const t = recipe.targets as { origin: { x: number }; spacing: { x: number }; counts: { x: number }; domainRuns: [number, number][] };
		const dom = expandRuns(t.domainRuns);
		const sand = new Set(view.provenance.domains.filter((d) => d.name.startsWith('Point-bar')).map((d) => d.index));
		for (const [th, L] of [[100, 0], [100, 20], [100, 50], [110, 20]]) {
			const w = await recipeWeakZonesOf(pid, r.id, { property: 'qc1Ncs', threshold: th, minLength: L, boundary: null }, db);
			const stats = (pred: (x: number) => boolean) => {
				let s = 0, n = 0, hi = 0;
				w.probabilityMap.forEach((v, c) => {
					const x = t.origin.x + (c % t.counts.x) * t.spacing.x;
					if (sand.has(dom[c]) && pred(x)) { s += v; n++; if (v > 0.5) hi++; }
				});
				return { mean: +(s / n).toFixed(3), over50: +(hi / n).toFixed(3), n };
			};
			out.push(JSON.stringify({ recipe: r.name, th, L, west: stats((x) => x < 169), east: stats((x) => x > 241) }));
			console.log(out[out.length - 1]);
		}
	}
	require('node:fs').writeFileSync('/tmp/alts/weak-east.jsonl', out.join('\n'));
	await stopRealizations();
}, 1_800_000);
