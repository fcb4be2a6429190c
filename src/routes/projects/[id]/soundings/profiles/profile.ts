// Turns a sounding's API response into the tracks, contacts and unit bands of its profile plot.
import type { SoundingDetailView } from '$lib/api';
import { PROPERTY_INFO, type SimulatedProperty } from '$lib/properties';

type Column = (number | null)[];

const scaled = (c: Column, k: number): Column => c.map((v) => (v === null ? null : v * k));

export interface Profile {
	id: string;
	name: string;
	groundElevation: number;
	chainage: number | null;
	depth: Column;
	tracks: {
		key: string;
		label: string;
		unit: string;
		values: Column;
		scale?: 'linear' | 'log';
		domain?: [number, number];
		plausible?: { min: number; max: number };
		fromZero?: boolean;
		colour: string;
		decimals: number;
		references?: { value: number; label: string }[];
	}[];
	contacts: { depth: number; label: string; colour: string; interpolated: boolean }[];
	bands: { top: number; bottom: number; colour: string }[];
	warnings: string[];
}

/** Which tracks to draw, and whether qc and fs go on log axes. */
export interface ProfileOptions {
	qc: boolean;
	fs: boolean;
	u2: boolean;
	Ic: boolean;
	property: boolean;
	/** qc and fs on log axes (they span decades between soft clay and dense sand). */
	log: boolean;
}

/** The catalogue's plausible range of a property, times k (kPa → MPa for qc). */
const plausible = (key: keyof typeof PROPERTY_INFO, k = 1) => ({ min: PROPERTY_INFO[key].range.min * k, max: PROPERTY_INFO[key].range.max * k });

/**
 * The profile of one sounding: qc (MPa), fs and u2 (kPa), Ic, and one track per property the project's
 * units are simulated in, each showing its values only within the units simulated in it (every reading
 * when the project has no units yet). Tracks are bounded by the catalogue's plausible ranges; contacts
 * drawn are those entered, picked, imported or interpolated (not the top unit's ground-surface default).
 */
export function profileOf(d: SoundingDetailView, shown: ProfileOptions): Profile {
	const tracks: Profile['tracks'] = [];
	const scale = shown.log ? ('log' as const) : ('linear' as const);
	if (shown.qc) {
		tracks.push({ key: 'qc', label: 'qc', unit: 'MPa', values: scaled(d.columns.qc, 1 / 1000), scale, fromZero: true, plausible: plausible('qc', 1 / 1000), colour: '#155a57', decimals: 2 });
	}
	if (shown.fs) tracks.push({ key: 'fs', label: 'fs', unit: 'kPa', values: d.columns.fs, scale, fromZero: true, plausible: plausible('fs'), colour: '#57534e', decimals: 1 });
	if (shown.u2 && d.columns.u2) tracks.push({ key: 'u2', label: 'u2', unit: 'kPa', values: d.columns.u2, plausible: plausible('u2'), colour: '#1d4ed8', decimals: 1 });
	if (shown.Ic && d.derived.Ic) {
		tracks.push({
			key: 'Ic',
			label: 'Ic',
			unit: '–',
			values: d.derived.Ic,
			domain: [PROPERTY_INFO.Ic.range.min, PROPERTY_INFO.Ic.range.max],
			colour: '#7c2d12',
			decimals: 2,
			references: [
				{ value: 2.05, label: 'sand-like below' },
				{ value: 2.6, label: 'clay-like above' }
			]
		});
	}
	if (shown.property) {
		const properties = d.units.length ? [...new Set(d.units.map((u) => u.property))] : (['qc1Ncs', 'suRatio'] as SimulatedProperty[]);
		for (const p of properties) {
			const info = PROPERTY_INFO[p];
			const source = d.derived[p];
			if (!source) continue;
			const values = d.units.length ? source.map((v, i) => (d.unit[i] >= 0 && d.units[d.unit[i]].property === p ? v : null)) : source;
			tracks.push({ key: `property-${p}`, label: info.label, unit: info.unit, values, plausible: plausible(p), colour: '#3f3f46', decimals: info.decimals });
		}
	}

	const present = d.units
		.filter((u) => u.topElevation !== null)
		.map((u) => ({ ...u, depth: d.sounding.groundElevation - (u.topElevation as number) }))
		.sort((a, b) => a.depth - b.depth);
	const bottom = d.columns.depth.reduce<number>((m, v) => (v !== null && v > m ? v : m), 0);
	return {
		id: d.sounding.id,
		name: d.sounding.name,
		groundElevation: d.sounding.groundElevation,
		chainage: d.sounding.chainage,
		depth: d.columns.depth,
		tracks,
		contacts: present.filter((u) => u.topSource !== 'ground').map((u) => ({ depth: u.depth, label: u.name, colour: u.colour, interpolated: u.topSource === 'interpolated' })),
		bands: present.map((u, k) => ({ top: u.depth, bottom: k + 1 < present.length ? present[k + 1].depth : bottom, colour: u.colour })),
		warnings: d.warnings
	};
}
