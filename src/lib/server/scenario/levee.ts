/**
 * The demo scenario: an invented river-levee section of our own, used only to make demo data.
 *
 * 400 m of levee toe along a straight section line. From the top: overbank clay — a soft, normally
 * consolidated clay below a thin desiccated crust — over a loose point-bar sand; an abandoned channel, plugged
 * with soft clay, cuts the sand near chainage 205 m, and the sand is looser on its west side than on its east
 * side; dense sand below. Elevations in m, chainage in m.
 * Nothing here is measured data: every number is chosen to look like a plausible site.
 */

/** Stratigraphic units of the scenario, top to bottom, with the parameters the synthesis uses. */
export const LEVEE_UNITS = [
	{
		key: 'overbank',
		name: 'Overbank clay',
		colour: '#8c6d46',
		kind: 'clay',
		gammaAbove: 17,
		gammaBelow: 17.5,
		nkt: 14,
		cfc: 0,
		property: 'suRatio'
	},
	{
		key: 'pointbar',
		name: 'Point-bar sand',
		colour: '#d9b44a',
		kind: 'sand',
		gammaAbove: 18,
		gammaBelow: 19.5,
		nkt: 14,
		cfc: 0,
		property: 'qc1Ncs'
	},
	{
		key: 'plug',
		name: 'Channel plug clay',
		colour: '#5f7f8c',
		kind: 'clay',
		gammaAbove: 16.5,
		gammaBelow: 16.5,
		nkt: 14,
		cfc: 0,
		property: 'suRatio'
	},
	{
		key: 'dense',
		name: 'Dense sand',
		colour: '#b5651d',
		kind: 'sand',
		gammaAbove: 19,
		gammaBelow: 20,
		nkt: 14,
		cfc: 0,
		property: 'qc1Ncs'
	}
] as const;

export type LeveeUnitKey = (typeof LEVEE_UNITS)[number]['key'];

/** Section line: start point and bearing (degrees clockwise from north), 400 m long. */
export const SECTION_LINE = {
	start: { x: 512_000, y: 4_183_000 },
	bearing: 60,
	length: 400
};

/** The sand is split into zones at this chainage, the axis of the abandoned channel. */
export const CHANNEL_AXIS = 205;
const CHANNEL_HALF_WIDTH = 36;

export const GROUNDWATER_ELEVATION = 2.5;
export const BOTTOM_ELEVATION = -12;
export const READING_INTERVAL = 0.02;
export const FIRST_DEPTH = 0.1;
export const AREA_RATIO = 0.8;

/**
 * Thickness of the desiccated crust at the top of the overbank clay (m below ground): 0.85–1.15 m, within
 * the zone the water table (1.5 m below ground) leaves dry in summer.
 */
export function crustThickness(c: number): number {
	return 1.0 + 0.15 * wave(c / 80 + 0.7);
}

/** Undrained strength the crust adds at the ground surface (kPa), fading to nothing at its base. */
export const CRUST_STRENGTH = 30;

/**
 * The demo's rule for its overbank clay domains: readings shallower than this (m) are left out, the thickest
 * crust of the section plus 0.1 m rounded up to 0.05 m (1.25 m), so the domains stand for the soft clay below.
 */
export const OVERBANK_MIN_DEPTH = (() => {
	let t = 0;
	for (let c = 0; c <= 400; c++) t = Math.max(t, crustThickness(c));
	return Math.ceil((t + 0.1) * 20) / 20;
})();

/** Ground elevation along the section: a gently undulating toe near +4 m. */
export function groundElevation(c: number): number {
	return 4.0 + 0.25 * wave(c / 90) - 0.0008 * (c - 200);
}

/** Top of the point-bar sand, before the channel cuts it. */
export function sandTopElevation(c: number): number {
	return 1.4 - 0.003 * (c - 200) + 0.35 * wave(c / 55 + 1.3);
}

/** Top of the dense sand. */
export function denseTopElevation(c: number): number {
	return -6.4 + 0.0025 * c + 0.3 * wave(c / 70 + 0.4);
}

/** Base of the channel plug where the channel exists, else NaN. Parabolic, resting on the dense sand. */
export function channelBaseElevation(c: number): number {
	const t = (c - CHANNEL_AXIS) / CHANNEL_HALF_WIDTH;
	if (Math.abs(t) >= 1) return NaN;
	const top = sandTopElevation(c);
	const deepest = denseTopElevation(CHANNEL_AXIS) - 1;
	return Math.max(top - (top - deepest) * (1 - t * t), denseTopElevation(c));
}

/**
 * Top elevation of each unit at chainage c, in LEVEE_UNITS order; NaN where the unit is absent.
 * Inside the channel the plug replaces the sand from the sand's top down to the channel base; a sliver
 * of sand remains below the plug where the base is above the dense sand.
 */
export function unitTops(c: number): Record<LeveeUnitKey, number> {
	const ground = groundElevation(c);
	const sand = sandTopElevation(c);
	const dense = denseTopElevation(c);
	const base = channelBaseElevation(c);
	if (Number.isNaN(base)) return { overbank: ground, pointbar: sand, plug: NaN, dense };
	const sliver = base - dense > 0.05;
	return { overbank: ground, pointbar: sliver ? base : NaN, plug: sand, dense };
}

/** The unit at elevation z of chainage c. */
export function unitAt(c: number, z: number): LeveeUnitKey {
	const tops = unitTops(c);
	if (z <= tops.dense) return 'dense';
	if (Number.isNaN(tops.plug)) return z > tops.pointbar ? 'overbank' : 'pointbar';
	if (z > tops.plug) return 'overbank';
	return !Number.isNaN(tops.pointbar) && z <= tops.pointbar ? 'pointbar' : 'plug';
}

export interface ScenarioSounding {
	id: string;
	chainage: number;
	offset: number;
	x: number;
	y: number;
	groundElevation: number;
}

/**
 * 25 soundings along the line, about 16 m apart with a fixed jitter, a few metres off the line.
 * The jitter comes from a fixed table so the layout never depends on a random stream.
 */
export function scenarioSoundings(): ScenarioSounding[] {
	const jitter = [1.8, -2.6, 0.7, 3.1, -1.2, 2.2, -3.4, 0.4, 1.6, -0.9, 2.8, -2.1, 0.2, -1.7, 3.3, -0.5, 1.1, -2.9, 2.5, -1.4, 0.9, -3.0, 1.9, -0.3, 2.0];
	const offsets = [2.1, -1.4, 3.6, -2.8, 0.9, -3.9, 1.7, -0.6, 2.9, -2.2, 0.4, 3.2, -1.1, 2.4, -3.3, 1.3, -0.8, 3.8, -2.5, 0.6, 2.7, -1.9, 1.5, -3.5, 0.3];
	const bearing = (SECTION_LINE.bearing * Math.PI) / 180;
	const along = { x: Math.sin(bearing), y: Math.cos(bearing) };
	const across = { x: along.y, y: -along.x };
	return jitter.map((j, i) => {
		const chainage = round(8 + i * 16 + j, 1);
		const offset = offsets[i];
		return {
			id: `LV-${String(i + 1).padStart(2, '0')}`,
			chainage,
			offset,
			x: round(SECTION_LINE.start.x + chainage * along.x + offset * across.x, 2),
			y: round(SECTION_LINE.start.y + chainage * along.y + offset * across.y, 2),
			groundElevation: round(groundElevation(chainage), 2)
		};
	});
}

// A smooth bounded wiggle without trigonometry, so the geometry is the same on every platform.
function wave(t: number): number {
	const f = t - Math.floor(t);
	const s = f < 0.5 ? f * 2 : 2 - f * 2;
	return s * s * (3 - 2 * s) * 2 - 1;
}

function round(v: number, digits: number): number {
	const k = 10 ** digits;
	return Math.round(v * k) / k;
}
