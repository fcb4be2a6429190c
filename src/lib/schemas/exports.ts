/**
 * Request bodies and queries of the Exports section: mesh uploads, transfer tables and sets, download queries and
 * export jobs; and the catalogue of published transfer relations (one catalogue, every list derived from it).
 */
import { z } from 'zod';
import { lookupTableProblem } from '$lib/cpt/lookupTable';
import { ENSEMBLE_STATS, type EnsembleStat } from '$lib/ensemble';
import type { SimulatedProperty } from '$lib/properties';
import { thresholdParam } from './recipe';
import { simulatedProperty } from './stratigraphy';

/**
 * The published relations a simulated property can be carried through to a model parameter, each with the
 * property it reads, the column it writes and its unit.
 */
export const TRANSFER_RELATIONS = {
	'dr-ib2008': {
		input: 'qc1Ncs',
		column: 'Dr',
		unit: '–',
		label: 'Relative density Dr, fraction (Idriss & Boulanger 2008)',
		source: 'Dr = 0.465·(qc1Ncs/0.9)^0.264 − 1.063; Idriss & Boulanger (2008), Soil Liquefaction During Earthquakes, EERI MNO-12',
		// qc1Ncs 21–254 maps to Dr 0–1 with Cdq = 0.9; beyond, the value is held at the end (and counted).
		range: [21, 254]
	},
	'crr-bi2014': {
		input: 'qc1Ncs',
		column: 'CRR_M7.5_1atm',
		unit: '–',
		label: 'CRR for M 7.5 and σ′v = 1 atm (Boulanger & Idriss 2014)',
		source: 'CRR = exp(qc1Ncs/113 + (qc1Ncs/1000)² − (qc1Ncs/140)³ + (qc1Ncs/137)⁴ − 2.80); Boulanger & Idriss (2014), UCD/CGM-14/01',
		// The curve is drawn up to qc1Ncs ≈ 211, where CRR ≈ 3.7 (memory); the polynomial grows without bound beyond
		// it, so the input is held at 211 (and counted) rather than giving absurd resistances.
		range: [-Infinity, 211]
	},
	'su-from-ratio': {
		input: 'suRatio',
		column: 'su',
		unit: 'kPa',
		label: 'su = su/σ′v × σ′v at the element (unit weights and groundwater)',
		source: 'σ′v at the element from the units’ weights above and below the water table and the groundwater interpolated between the soundings, as the CPT derivation computes it at a reading',
		range: [-Infinity, Infinity]
	}
} as const satisfies Record<string, { input: SimulatedProperty; column: string; unit: string; label: string; source: string; range: readonly [number, number] }>;

export type TransferRelation = keyof typeof TRANSFER_RELATIONS;
export const TRANSFER_RELATION_KEYS = Object.keys(TRANSFER_RELATIONS) as [TransferRelation, ...TransferRelation[]];

const name = (what: string) =>
	z
		.string({ error: `Give the ${what} a name.` })
		.trim()
		.min(1, { error: `Give the ${what} a name.` })
		.max(80, { error: 'Use at most 80 characters.' });
const note = z.string().trim().max(2000, { error: 'Use at most 2000 characters.' }).default('');

/** A model-parameter column name: letters, digits, and . _ - (so every model program's CSV reader takes it). */
export const columnName = z
	.string({ error: 'Name the output column.' })
	.trim()
	.regex(/^[A-Za-z][A-Za-z0-9_.-]{0,39}$/, { error: 'A column name starts with a letter and has at most 40 letters, digits, dots, dashes or underscores.' });

/** A lookup table as saved (POST …/transfer-tables): a new name is version 1, a name again the next version. */
export const transferTableSaveSchema = z
	.object({
		name: name('table'),
		input: simulatedProperty,
		output: columnName,
		outputUnit: z.string().trim().max(20, { error: 'Use at most 20 characters for the unit.' }).default('–'),
		monotonic: z.enum(['increasing', 'decreasing', 'none'], { error: 'Say whether the output must increase, decrease, or neither.' }),
		points: z
			.array(z.tuple([z.number(), z.number()]), { error: 'Give the points as [input, output] pairs.' })
			.min(2, { error: 'A table needs at least two points.' })
			.max(1000, { error: 'A table has at most 1000 points.' }),
		note
	})
	.strict()
	.superRefine((t, ctx) => {
		const problem = lookupTableProblem(t);
		if (problem) ctx.addIssue({ code: 'custom', message: problem, path: ['points'] });
	});

/** One output of a transfer rule: a published relation or one of the project's tables (a saved version). */
export const transferOutputSchema = z.union([
	z.object({ relation: z.enum(TRANSFER_RELATION_KEYS, { error: `Choose a relation: ${TRANSFER_RELATION_KEYS.join(', ')}.` }) }).strict(),
	z.object({ tableId: z.string().min(1) }).strict()
]);

/**
 * A rule of a transfer set: for the domains simulated in `property` (all of them, or only the domain named by
 * `domain`, which then wins over a rule for all), the outputs to write.
 */
export const transferRuleSchema = z
	.object({
		property: simulatedProperty,
		/** A domain's name; null: every domain simulated in the property. */
		domain: z.string().trim().min(1).max(80).nullable().default(null),
		outputs: z.array(transferOutputSchema).min(1, { error: 'A rule writes at least one output.' }).max(20)
	})
	.strict();

export const transferSetSaveSchema = z
	.object({
		name: name('transfer set'),
		rules: z.array(transferRuleSchema).min(1, { error: 'A transfer set needs at least one rule.' }).max(50),
		note
	})
	.strict()
	.refine((s) => new Set(s.rules.map((r) => `${r.property}|${r.domain ?? ''}`)).size === s.rules.length, {
		error: 'Each property (or domain) has one rule.',
		path: ['rules']
	});

/** The mapping of a mesh file's columns and the mesh's name (multipart `options` of POST …/meshes). */
export const meshUploadOptionsSchema = z
	.object({
		name: name('mesh'),
		mapping: z
			.object({
				delimiter: z.enum([',', ';', '\t']).optional(),
				id: z.string().min(1, { error: 'Map the element id column.' }),
				x: z.string().min(1, { error: 'Map the chainage (or easting) column.' }),
				y: z.string().min(1).optional(),
				z: z.string().min(1, { error: 'Map the elevation column.' }),
				group: z.string().min(1).optional()
			})
			.strict()
	})
	.strict();

/** Most realizations one request names. */
export const MAX_EXPORT_REALIZATIONS = 500;

/**
 * A list of realization numbers as text: "0-19", "0,3,7-9" (ascending, no repeats), at most 500. Parsed to the
 * numbers; their range against the recipe's N is checked by the service.
 */
export const realizationList = z
	.string({ error: 'Name the realizations, e.g. 0-19.' })
	.trim()
	.transform((text, ctx) => {
		const out: number[] = [];
		for (const part of text.split(',')) {
			const m = /^\s*(\d{1,6})\s*(?:-\s*(\d{1,6})\s*)?$/.exec(part);
			if (!m) {
				ctx.addIssue({ code: 'custom', message: `'${part.trim()}' is not a realization number or range (e.g. 0-19).` });
				return z.NEVER;
			}
			const a = Number(m[1]);
			const b = m[2] === undefined ? a : Number(m[2]);
			if (b < a || (out.length && a <= out[out.length - 1])) {
				ctx.addIssue({ code: 'custom', message: 'List realizations in ascending order, each once.' });
				return z.NEVER;
			}
			if (out.length + b - a + 1 > MAX_EXPORT_REALIZATIONS) {
				ctx.addIssue({ code: 'custom', message: `At most ${MAX_EXPORT_REALIZATIONS} realizations at a time.` });
				return z.NEVER;
			}
			for (let r = a; r <= b; r++) out.push(r);
		}
		return out;
	});

const digits = z.coerce
	.number({ error: 'digits must be a number.' })
	.int({ error: 'digits must be a whole number.' })
	.min(1, { error: 'digits must be 1–17.' })
	.max(17, { error: 'digits must be 1–17.' });

/** The ensemble maps to include, as "mean,sd,p10,p50,p90,below". */
const mapList = z
	.string()
	.trim()
	.transform((text, ctx) => {
		if (text === '') return [] as EnsembleStat[];
		const stats = text.split(',').map((s) => s.trim());
		const bad = stats.find((s) => !(ENSEMBLE_STATS as readonly string[]).includes(s));
		if (bad !== undefined) {
			ctx.addIssue({ code: 'custom', message: `'${bad}' is not an ensemble map: ${ENSEMBLE_STATS.join(', ')}.` });
			return z.NEVER;
		}
		return [...new Set(stats)] as EnsembleStat[];
	});

const threshold = thresholdParam;

/** GET …/realizations/:r.csv and .vtk: `digits` (CSV: significant digits; default shortest round-trip) and `transfer`. */
export const fileQuerySchema = z.object({
	digits: digits.optional(),
	transfer: z.string().min(1).optional()
});

/** GET …/export.zip: the realizations, the format, and optionally digits, a transfer set and ensemble maps. */
export const zipQuerySchema = z
	.object({
		realizations: realizationList,
		format: z.enum(['csv', 'vtk'], { error: 'format is csv or vtk.' }).default('csv'),
		digits: digits.optional(),
		transfer: z.string().min(1).optional(),
		maps: mapList.optional(),
		threshold
	})
	.refine((q) => !q.maps?.includes('below') || q.threshold !== null, { error: 'P(below) needs a threshold.', path: ['threshold'] });

/** GET …/maps.csv and maps.vtk: which ensemble maps (default all but P(below)), and P(below)'s threshold. */
export const mapsQuerySchema = z
	.object({ stats: mapList.optional(), threshold, digits: digits.optional() })
	.refine((q) => !q.stats?.includes('below') || q.threshold !== null, { error: 'P(below) needs a threshold.', path: ['threshold'] });

/** POST …/exports: an export job of a recipe, as export.zip takes it. */
export const exportJobSchema = z
	.object({
		recipeId: z.string({ error: 'Choose a recipe.' }).min(1, { error: 'Choose a recipe.' }),
		realizations: realizationList,
		format: z.enum(['csv', 'vtk'], { error: 'format is csv or vtk.' }).default('csv'),
		digits: digits.nullable().default(null),
		transferSetId: z.string().min(1).nullable().default(null),
		maps: z.array(z.enum(ENSEMBLE_STATS)).max(ENSEMBLE_STATS.length).default([]),
		threshold: z.number().refine(Number.isFinite).nullable().default(null)
	})
	.strict()
	.refine((q) => !q.maps.includes('below') || q.threshold !== null, { error: 'P(below) needs a threshold.', path: ['threshold'] });

export type TransferTableSave = z.output<typeof transferTableSaveSchema>;
export type TransferSetSave = z.output<typeof transferSetSaveSchema>;
export type TransferRule = z.output<typeof transferRuleSchema>;
export type TransferOutput = z.output<typeof transferOutputSchema>;
export type MeshUploadOptions = z.output<typeof meshUploadOptionsSchema>;
export type ExportJobRequest = z.output<typeof exportJobSchema>;
