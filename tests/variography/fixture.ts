// A hand-built domain's samples as the domain-samples endpoint gives them: soundings along a 2D section with
// readings every 0.05 m, values smooth in z and along the chainage plus noise (seeded), and declustering
// weights that favour the sparse east end. Invented data for tests only.
import seedrandom from 'seedrandom';
import type { DomainSamplesData } from '../../src/lib/variography/index';

export function handDomain({ soundings = 8, spacing = 15, readings = 160, seed = 'variography' } = {}): DomainSamplesData {
	const rng = seedrandom(seed);
	// Box–Muller standard normal deviates.
	const normal = () => Math.sqrt(-2 * Math.log(1 - rng())) * Math.cos(2 * Math.PI * rng());
	const x: number[] = [];
	const y: number[] = [];
	const z: number[] = [];
	const value: number[] = [];
	const sounding: string[] = [];
	const weights: number[] = [];
	// A lateral trend b(c): an exponential (Markov) process along the chainage, practical range 40 m; and within
	// each sounding a vertical exponential process a(z), practical range 0.8 m (AR(1) with ρ = exp(−3Δ/a)).
	let b = normal();
	let cPrev = 0;
	for (let s = 0; s < soundings; s++) {
		// Uneven spacing, so the declustering weights differ between soundings.
		const c = s < soundings / 2 ? s * spacing * 0.5 : s * spacing;
		const rhoB = Math.exp((-3 * (c - cPrev)) / 40);
		b = rhoB * b + Math.sqrt(1 - rhoB * rhoB) * normal();
		cPrev = c;
		const top = 1 + 0.3 * rng();
		const rhoA = Math.exp((-3 * 0.05) / 0.8);
		let a = normal();
		for (let i = 0; i < readings; i++) {
			a = rhoA * a + Math.sqrt(1 - rhoA * rhoA) * normal();
			x.push(c);
			y.push(0);
			z.push(top - 0.05 * i);
			value.push(50 + 8 * a + 6 * b);
			sounding.push(`T-${String(s + 1).padStart(2, '0')}`);
			weights.push(s < soundings / 2 ? 1 : 2);
		}
	}
	const total = weights.reduce((p, q) => p + q, 0);
	return { lengthUnit: 'm', samples: { x, y, z, value, sounding }, weights: weights.map((w) => w / total) };
}
