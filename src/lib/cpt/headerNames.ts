// Private helpers shared by previewDelimited and parseDelimited: what a header's name says it holds.
import { lengthUnitFactor, stressUnitFactor } from './units';

/** A header split into a comparison key (letters and digits, lower case) and a unit, if it names one. */
export function splitName(header: string): { key: string; unit?: string } {
	let name = header.trim();
	let unit: string | undefined;
	const bracket = /^(.*?)[[(]\s*([^\])]*?)\s*[\])]\s*$/.exec(name);
	if (bracket) {
		name = bracket[1];
		unit = bracket[2];
	} else {
		const suffix = /^(.*?)[\s_]+([A-Za-z]+(?:\/[A-Za-z]+2?)?)$/.exec(name);
		if (suffix && (stressUnitFactor(suffix[2]) !== undefined || lengthUnitFactor(suffix[2]) !== undefined)) {
			name = suffix[1];
			unit = suffix[2];
		}
	}
	return { key: headerKey(name), unit };
}

/** Case, spaces and punctuation do not matter: "Point ID", "point_id" and "PointID" share the key "pointid". */
export function headerKey(name: string): string {
	return name.toLowerCase().replace(/[^a-z0-9]/g, '');
}

/*
 * Names a sounding-id column goes by (keys as headerKey makes them), best first. A rule of our own, from
 * the headers that survey contractors' exports, spreadsheets and the AGS4 LOCA_ID commonly use. "no", "nr"
 * and "index" alone are left out: they usually number rows, not soundings.
 */
const ID_STEMS = ['point', 'sounding', 'cpt', 'cptu', 'test', 'location', 'loca', 'hole', 'borehole', 'probe', 'station'];
const ID_SUFFIXES = ['id', 'name', '', 'no', 'nr', 'number', 'code', 'ref'];
const ID_KEYS: string[] = [
	...ID_STEMS.flatMap((stem) => ID_SUFFIXES.filter((s) => !(stem === 'station' && s === '')).map((s) => stem + s)),
	'name',
	'id'
];

/** Names a ground-elevation column goes by (keys), best first; "Z (m NAP)" splits into key "z" and unit "m NAP". */
const GROUND_KEYS: string[] = [
	'groundelevation',
	'groundlevel',
	'groundrl',
	'surfaceelevation',
	'surfacelevel',
	'zground',
	'groundz',
	'zsurface',
	'gl',
	'locagl',
	'elevation',
	'elev',
	'rl',
	'reducedlevel',
	'startelevation',
	'collarelevation',
	'z',
	'zid',
	'znap',
	'zmnap',
	'mnap',
	'nap',
	'maaiveld',
	'mv',
	'mvnap'
];

/** Rank of a header as a sounding-id column (0 best), or −1 when its name does not say so. */
export function idRank(header: string): number {
	return ID_KEYS.indexOf(splitName(header).key);
}

/** Rank of a header as a ground-elevation column (0 best), or −1 when its name does not say so. */
export function groundRank(header: string): number {
	return GROUND_KEYS.indexOf(splitName(header).key);
}
