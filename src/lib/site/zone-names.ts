/**
 * Names of a unit's zones, west to east: the stored names where they fit the number of zones (boundaries + 1),
 * else "Zone 1", "Zone 2" …; a unit without boundaries has one zone, named after the unit unless one name is stored.
 */
export function zoneNamesOf(unit: { name: string; zoneNames: string[] | null }, boundaryCount: number): string[] {
	const n = boundaryCount + 1;
	if (n === 1) return [unit.zoneNames?.length === 1 ? unit.zoneNames[0] : unit.name];
	return Array.from({ length: n }, (_, k) => unit.zoneNames?.[k] ?? `Zone ${k + 1}`);
}
