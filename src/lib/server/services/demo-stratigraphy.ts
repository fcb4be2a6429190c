import { eq } from 'drizzle-orm';
import { fromFloat64Blob } from '$lib/server/db/float64';
import { contacts, soundings } from '$lib/server/db/site-schema';
import {
	BOTTOM_ELEVATION,
	CHANNEL_AXIS,
	GROUNDWATER_ELEVATION,
	LEVEE_UNITS,
	OVERBANK_MIN_DEPTH,
	SECTION_LINE,
	scenarioSoundings,
	unitTops,
	type LeveeUnitKey
} from '$lib/server/scenario/levee';
import type { DbOrTx } from '$lib/server/db/transaction';
import { updateSite } from './site';
import { createUnit, createZoneBoundary } from './stratigraphy';
import { createZonation } from './zonations';
import { DEFAULT_RULES } from '$lib/site';

/**
 * Stacking order of the demo units, top down. The channel plug sits above the sliver of point-bar sand
 * that remains below it, so it stacks above the sand; outside the channel it is simply absent.
 */
const STACK: LeveeUnitKey[] = ['overbank', 'plug', 'pointbar', 'dense'];

/** Domain settings of the demo: readings averaged to 0.2 m cells, plan cells of 40 m for declustering. */
const DEMO_CELL = { cellHeight: 0.2, averaging: 'mean' as const, declusterCell: { x: 40, y: 40, z: null } };

/**
 * The overbank clay's rules leave its desiccated crust out: readings shallower than the thickest crust of the
 * scenario plus 0.1 m (OVERBANK_MIN_DEPTH, 1.25 m), so the domain stands for the soft normally consolidated clay below.
 */
export const OVERBANK_RULES = { ...DEFAULT_RULES, minDepth: OVERBANK_MIN_DEPTH };

/**
 * Seeds the demo project's stratigraphy from the invented levee scenario: site settings (section line,
 * groundwater), the four units with their parameters, the contacts at each demo sounding from the scenario's
 * unit tops at its chainage, a vertical zone boundary splitting the point-bar sand at the channel axis into
 * West and East, and two zonations (sand split at the channel; sand grouped), the overbank clay leaving its
 * crust out (OVERBANK_RULES). The demo soundings must already be loaded. Returns the ids it created.
 */
export function seedDemoStratigraphy(db: DbOrTx, projectId: string): { units: Record<LeveeUnitKey, string>; zonations: string[] } {
	const bearing = (SECTION_LINE.bearing * Math.PI) / 180;
	const end: [number, number] = [
		round(SECTION_LINE.start.x + SECTION_LINE.length * Math.sin(bearing), 2),
		round(SECTION_LINE.start.y + SECTION_LINE.length * Math.cos(bearing), 2)
	];
	updateSite(
		projectId,
		{ geometry: '2d', sectionLine: [[SECTION_LINE.start.x, SECTION_LINE.start.y], end], offLineTolerance: 10, groundwaterElevation: GROUNDWATER_ELEVATION },
		db
	);

	const ids = {} as Record<LeveeUnitKey, string>;
	STACK.forEach((key, position) => {
		const u = LEVEE_UNITS.find((l) => l.key === key)!;
		ids[key] = createUnit(
			projectId,
			{
				name: u.name,
				colour: u.colour,
				position,
				gammaAbove: u.gammaAbove,
				gammaBelow: u.gammaBelow,
				nkt: u.nkt,
				cfc: u.cfc,
				property: u.property,
				zoneNames: key === 'pointbar' ? ['West', 'East'] : null
			},
			db
		).id;
	});

	const byName = new Map(scenarioSoundings().map((s) => [s.id, s]));
	const rows = db
		.select({ id: soundings.id, name: soundings.name, ground: soundings.groundElevation, depth: soundings.depth })
		.from(soundings)
		.where(eq(soundings.projectId, projectId))
		.all();
	for (const row of rows) {
		const s = byName.get(row.name);
		if (!s) continue;
		const tops = unitTops(s.chainage);
		const elevations = Array.from(fromFloat64Blob(row.depth), (d) => row.ground - d);
		for (const key of STACK) {
			const top = tops[key];
			if (Number.isNaN(top)) continue;
			// The overbank clay starts at the ground surface as stored with the sounding.
			const topElevation = key === 'overbank' ? row.ground : Math.min(snapBetweenReadings(top, elevations), row.ground);
			db.insert(contacts).values({ soundingId: row.id, unitId: ids[key], topElevation }).run();
		}
	}

	createZoneBoundary(
		projectId,
		{ unitId: ids.pointbar, chainageTop: CHANNEL_AXIS, elevationTop: 6, chainageBottom: CHANNEL_AXIS, elevationBottom: BOTTOM_ELEVATION },
		db
	);

	const clay = (name: string, key: LeveeUnitKey) => ({
		name,
		property: 'suRatio' as const,
		...DEMO_CELL,
		members: [{ unitId: ids[key], zone: -1 }],
		...(key === 'overbank' ? { rules: OVERBANK_RULES } : {})
	});
	const sand = (name: string, zone: number) => ({ name, property: 'qc1Ncs' as const, ...DEMO_CELL, members: [{ unitId: ids.pointbar, zone }] });
	const dense = { name: 'Dense sand', property: 'qc1Ncs' as const, ...DEMO_CELL, members: [{ unitId: ids.dense, zone: -1 }] };
	const split = createZonation(
		projectId,
		{
			name: 'Sand split at channel',
			description: 'The point-bar sand in two domains, west and east of the abandoned channel (chainage 205 m).',
			domains: [clay('Overbank clay', 'overbank'), sand('Point-bar sand west', 0), sand('Point-bar sand east', 1), clay('Channel plug clay', 'plug'), dense]
		},
		db
	);
	const grouped = createZonation(
		projectId,
		{
			name: 'Sand grouped',
			description: 'The point-bar sand as one domain on both sides of the channel.',
			domains: [clay('Overbank clay', 'overbank'), sand('Point-bar sand', -1), clay('Channel plug clay', 'plug'), dense]
		},
		db
	);
	return { units: ids, zonations: [split.id, grouped.id] };
}

/**
 * A contact elevation a person would type (a few decimals) that puts every reading in the same unit as the
 * exact scenario contact does: the midpoint between the two readings on either side of it. Rounding the
 * exact value instead could move a reading on the contact into the wrong unit and leave a sand value in a
 * clay domain.
 */
function snapBetweenReadings(top: number, elevations: number[]): number {
	let above = Infinity;
	let below = -Infinity;
	for (const z of elevations) {
		if (z > top) above = Math.min(above, z);
		else below = Math.max(below, z);
	}
	if (!Number.isFinite(above) || !Number.isFinite(below)) return round(top, 2);
	return round((above + below) / 2, 3);
}

function round(v: number, digits: number): number {
	const k = 10 ** digits;
	return Math.round(v * k) / k;
}
