import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { derive } from '$lib/cpt';
import { expectSameBits } from '../asserts';

// Derived properties feed conditioning data that browser and server must agree on bit for bit. Node.js 20 and
// Chromium differ in the bits of Math.exp/log/pow/… (measured, REFERENCES.md), so src/lib/cpt uses
// @stdlib/math-base-special-* like the engine; basic arithmetic, Math.sqrt/abs/min/max agree.
const BANNED = /\bMath\s*\.\s*(?:exp|expm1|log|log1p|log2|log10|pow|sin|cos|tan|asin|acos|atan|atan2|sinh|cosh|tanh|cbrt|hypot|random)\b|\*\*/;
const COMMENTS = /\/\*[\s\S]*?\*\/|\/\/[^\n]*/g;

describe('src/lib/cpt determinism', () => {
	it('src/lib/cpt uses no transcendental Math function, ** or Math.random', () => {
		const dir = join(process.cwd(), 'src/lib/cpt');
		const hits: string[] = [];
		for (const name of readdirSync(dir).filter((f) => f.endsWith('.ts'))) {
			const code = readFileSync(join(dir, name), 'utf8').replace(COMMENTS, (m) => m.replace(/[^\n]/g, ' '));
			code.split('\n').forEach((line, i) => {
				if (BANNED.test(line)) hits.push(`${name}:${i + 1}: ${line.trim()}`);
			});
		}
		expect(hits).toEqual([]);
	});

	it('derive(sounding, options) repeats bit for bit', () => {
		const depth = Array.from({ length: 200 }, (_, i) => 0.05 * (i + 1));
		const s = { depth, qc: depth.map((z) => 800 + 900 * z), fs: depth.map((z) => 10 + z), u2: depth.map((z) => 9 * z), groundElevation: 2 };
		const o = { units: [{ topElevation: 2, gammaAbove: 17, gammaBelow: 18 }, { topElevation: -4, gammaAbove: 19, gammaBelow: 20, CFC: 0.05 }], groundwaterElevation: 0.5 };
		const a = derive(s, o);
		const b = derive(s, o);
		for (const key of ['qt', 'sigmaVeff', 'Ic', 'n', 'FC', 'qc1Ncs', 'CRR', 'Dr', 'su'] as const) expectSameBits(a[key], b[key], key);
	});
});
