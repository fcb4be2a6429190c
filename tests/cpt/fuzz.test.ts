// Fuzzing the parsers: seeded random bytes, truncations and mutations of valid files. Every case must end
// in either well-formed soundings or a CptParseError — never another exception.
import { describe, expect, it } from 'vitest';
import seedrandom from 'seedrandom';
import {
	CptParseError,
	decodeCptText,
	formatAgs4,
	formatDelimited,
	formatGef,
	parseAgs4,
	parseDelimited,
	parseGef,
	previewDelimited
} from '$lib/cpt';
import type { DelimitedMapping, ParsedSounding } from '$lib/cpt';

const rng = seedrandom('conefield-cpt-fuzz');
const int = (n: number) => Math.floor(rng() * n);

function sounding(id: string, n: number): ParsedSounding {
	const depth = Float64Array.from({ length: n }, (_, i) => 0.02 * (i + 1));
	return {
		id,
		x: 1000 + int(100),
		y: 2000 + int(100),
		groundElevation: 3 + rng(),
		areaRatio: 0.8,
		depth,
		qc: depth.map(() => (rng() < 0.05 ? NaN : 500 + rng() * 20000)),
		fs: depth.map(() => rng() * 150),
		u2: depth.map(() => rng() * 300 - 20)
	};
}
const soundings = [sounding('CPT-1', 25), sounding('CPT-2', 20)];
const VALID = {
	gef: formatGef(soundings[0], { columnSeparator: ';', recordSeparator: '!' }),
	gefPlain: formatGef(soundings[1]),
	ags4: formatAgs4(soundings),
	csv: formatDelimited(soundings),
	tsv: formatDelimited(soundings, { delimiter: '\t' })
};
const MAPPING: DelimitedMapping = {
	id: 'sounding',
	depth: 'depth (m)',
	qc: 'qc (MPa)',
	fs: 'fs (kPa)',
	u2: 'u2 (kPa)',
	units: { depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' },
	x: { column: 'easting (m)' },
	y: { column: 'northing (m)' },
	groundElevation: { column: 'ground elevation (m)' },
	areaRatio: { column: 'area ratio' }
};

/** Runs every parser on `text`; fails the test on any outcome but valid soundings or a CptParseError. */
function check(text: string, label: string): number {
	let accepted = 0;
	const attempts: (() => ParsedSounding[])[] = [
		() => parseGef(text, { file: 'f.gef' }),
		() => parseAgs4(text, { file: 'f.ags' }),
		() => parseDelimited(text, MAPPING, { file: 'f.csv' }),
		() => {
			const { guess } = previewDelimited(text);
			return parseDelimited(text, guess as DelimitedMapping);
		}
	];
	for (const attempt of attempts) {
		let out: ParsedSounding[];
		try {
			out = attempt();
		} catch (e) {
			if (!(e instanceof CptParseError)) {
				expect.fail(`${label}: ${e instanceof Error ? e.stack : String(e)}\n--- input ---\n${JSON.stringify(text.slice(0, 2000))}`);
			}
			if (!e.message) expect.fail(`${label}: CptParseError without a message`);
			continue;
		}
		accepted++;
		// Plain checks rather than expect() per reading keep thousands of cases fast.
		if (!Array.isArray(out)) expect.fail(`${label}: result is not an array`);
		for (const s of out) {
			const n = s.depth.length;
			if (n === 0 || s.qc.length !== n || s.fs.length !== n || (s.u2 && s.u2.length !== n) || typeof s.id !== 'string') {
				expect.fail(`${label}: malformed sounding ${JSON.stringify(s.id)}`);
			}
			for (let i = 0; i < n; i++) {
				if (!Number.isFinite(s.depth[i]) || s.depth[i] < 0 || (i > 0 && !(s.depth[i] > s.depth[i - 1]))) expect.fail(`${label}: bad depth at ${i}`);
			}
		}
	}
	return accepted;
}

const NOISE = ['', ' ', ',', ';', '\t', '!', '"', '""', '\n', '\r\n', '#EOH=', '#COLUMN= 99', '-9999', 'abc', '1e400', 'NaN', '-', '0', '-1',
	'"DATA"', '"GROUP","SCPT"', '\u0000', '\uFFFD', 'é', '=', '#', '1,5', '"HEADING"', '1.0.0', '+', 'e5'];

function mutate(text: string): string {
	let t = text;
	const edits = 1 + int(4);
	for (let k = 0; k < edits; k++) {
		const at = int(t.length + 1);
		switch (int(6)) {
			case 0: // delete a span
				t = t.slice(0, at) + t.slice(at + 1 + int(20));
				break;
			case 1: // insert a token
				t = t.slice(0, at) + NOISE[int(NOISE.length)] + t.slice(at);
				break;
			case 2: // replace one character with a random one
				t = t.slice(0, at) + String.fromCharCode(int(128)) + t.slice(at + 1);
				break;
			case 3: {
				// swap two lines
				const lines = t.split('\n');
				const a = int(lines.length);
				const b = int(lines.length);
				[lines[a], lines[b]] = [lines[b], lines[a]];
				t = lines.join('\n');
				break;
			}
			case 4: {
				// duplicate a line
				const lines = t.split('\n');
				const a = int(lines.length);
				lines.splice(a, 0, lines[a]);
				t = lines.join('\n');
				break;
			}
			default: // replace a number with another token
				t = t.replace(/-?\d+\.\d+/, () => NOISE[int(NOISE.length)]);
		}
	}
	return t;
}

describe('parsers under fuzzing', () => {
	it('parseGef, parseAgs4, parseDelimited and previewDelimited accept the valid files', () => {
		for (const [name, text] of Object.entries(VALID)) expect(check(text, name), name).toBeGreaterThan(0);
	});

	it('never throw anything but CptParseError on seeded random bytes', () => {
		for (let k = 0; k < 800; k++) {
			const bytes = Uint8Array.from({ length: int(300) }, () => int(256));
			let text: string;
			try {
				text = decodeCptText(bytes);
			} catch (e) {
				expect(e).toBeInstanceOf(CptParseError);
				text = new TextDecoder().decode(bytes);
			}
			check(text, `random bytes ${k}`);
		}
	});

	it('never throw anything but CptParseError on seeded random printable text', () => {
		const alphabet = '0123456789.,;\t\n\r "#=-+eE!GROUPDATAHEADINGUNITqcfsu2depthEOH';
		for (let k = 0; k < 600; k++) {
			const text = Array.from({ length: int(400) }, () => alphabet[int(alphabet.length)]).join('');
			check(text, `random text ${k}`);
		}
	});

	it('never throw anything but CptParseError on truncated valid files', () => {
		const files = Object.values(VALID);
		for (let k = 0; k < 600; k++) {
			const text = files[k % files.length];
			check(text.slice(0, int(text.length)), `truncation ${k}`);
		}
	});

	it('never throw anything but CptParseError on mutated valid files', () => {
		const files = Object.values(VALID);
		let accepted = 0;
		for (let k = 0; k < 1600; k++) accepted += check(mutate(files[k % files.length]), `mutation ${k}`);
		// Many mutations leave a readable file (a changed digit, a swapped blank line): some must parse.
		expect(accepted).toBeGreaterThan(100);
	});
});
