import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import seedrandom from 'seedrandom';
import {
	experimentalVariogram,
	fitVariogram,
	normalScore,
	backTransform,
	cellDeclusterWeights,
	gamma,
	type Sample
} from '../../src/lib/geostat/index';
import { expectSameBits } from '../asserts';

// Measured on this project (REFERENCES.md): these Math functions return different bits in Node.js 20 and
// Chromium; the engine uses @stdlib/math-base-special-* instead. The other transcendental Math functions
// are banned too (same implementation family, never measured identical), as are Math.random (unseeded) and
// the ** operator (it is Math.pow).
const BANNED = [
	'exp', 'expm1', 'log', 'log1p', 'log2', 'log10', 'pow', 'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'atan2',
	'sinh', 'cosh', 'tanh', 'asinh', 'acosh', 'atanh', 'cbrt', 'hypot', 'random'
];
const DOT = new RegExp(`\\bMath\\s*\\.\\s*(?:${BANNED.join('|')})\\b`, 'g');
const BRACKET = new RegExp(`\\bMath\\s*\\[\\s*['"\`](?:${BANNED.join('|')})['"\`]\\s*\\]`, 'g');
const TOKENS = /\/\*[\s\S]*?\*\/|\/\/[^\n]*|'(?:\\.|[^'\\\n])*'|"(?:\\.|[^"\\\n])*"|`(?:\\.|[^`\\])*`/g;
const blank = (m: string) => m.replace(/[^\n]/g, ' ');

/** Banned uses in one file's text, as "line: match". Comments are ignored; strings only count as Math['name']. */
function bannedUses(text: string): string[] {
	// Comments blanked (strings kept, for bracket access), and a copy with strings blanked too.
	const noComments = text.replace(TOKENS, (m) => (m.startsWith('/') ? blank(m) : m));
	const noStrings = text.replace(TOKENS, (m) => (m.startsWith('/') ? blank(m) : m[0] + ' '.repeat(m.length - 2) + m[m.length - 1]));
	const hits: string[] = [];
	const a = noComments.split('\n');
	noStrings.split('\n').forEach((line, i) => {
		for (const m of line.matchAll(DOT)) hits.push(`${i + 1}: ${m[0]}`);
		for (const m of a[i].matchAll(BRACKET)) hits.push(`${i + 1}: ${m[0]}`);
		if (line.includes('**')) hits.push(`${i + 1}: **`);
	});
	return hits;
}

function files(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		return statSync(p).isDirectory() ? files(p) : /\.(ts|js|svelte)$/.test(name) ? [p] : [];
	});
}

describe('determinism rule for src/lib/geostat', () => {
	it('bannedUses flags Math.exp, bracket access and **, and ignores comments and strings', () => {
		expect(bannedUses('const a = Math.exp(1);')).toEqual(['1: Math.exp']);
		expect(bannedUses("const a = Math['pow'](2, 3);").length).toBe(1);
		expect(bannedUses('const a = x ** 2;')).toEqual(['1: **']);
		expect(bannedUses('const r = Math.random();')).toEqual(['1: Math.random']);
		expect(bannedUses('// Math.exp differs\n/** Math.log too */\nconst s = "Math.sin";\nconst a = Math.sqrt(Math.abs(x));')).toEqual([]);
		expect(bannedUses('const e = Math.exponent; const m = Math.max(1, Math.floor(2));')).toEqual([]);
	});

	it('no file under src/lib/geostat calls a banned Math function or uses **', () => {
		const root = join(__dirname, '../../src/lib/geostat');
		const all = files(root);
		expect(all.length).toBeGreaterThan(5);
		const offences = all.flatMap((f) => bannedUses(readFileSync(f, 'utf8')).map((h) => `${relative(root, f)}:${h}`));
		expect(offences).toEqual([]);
	});

	it('a normal-score, declustering, variogram and fit pipeline repeats bit for bit', () => {
		const run = () => {
			const rng = seedrandom('pipeline');
			const samples: Sample[] = [];
			for (let s = 0; s < 6; s++) {
				let v = 0;
				for (let i = 0; i < 120; i++) {
					v = 0.9 * v + rng() - 0.5;
					samples.push({ x: 9 * s, y: 4 * (s % 2), z: -0.05 * i, value: Math.exp(v), sounding: `S${s}` });
				}
			}
			const w = cellDeclusterWeights(samples, { x: 10, y: 10, z: Infinity });
			const ns = normalScore(samples.map((p) => p.value), w, { zmin: 0, zmax: 10 });
			const y = samples.map((p, i) => ({ ...p, value: ns.scores[i] }));
			const vert = experimentalVariogram(y, { direction: 'vertical', lag: 0.05, nLags: 20 });
			const hor = experimentalVariogram(y, { direction: 'horizontal', lag: 9, nLags: 5, verticalBand: 0.01 });
			const m = fitVariogram({ vertical: vert, horizontal: hor }, { type: 'exponential', nugget: 'fit', minPairs: 5 });
			const out = [
				...w,
				...ns.scores,
				...vert.flatMap((b) => [b.h, b.gamma, b.pairs]),
				...hor.flatMap((b) => [b.h, b.gamma, b.pairs]),
				...m.structures.flatMap((s) => [s.sill, s.rangeMajor, s.rangeMinor, s.rangeVertical]),
				backTransform(ns.table, 0.3),
				gamma(m, 1, 2, 0.3)
			];
			return out;
		};
		expectSameBits(run(), run());
	});
});
