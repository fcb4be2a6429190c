import { csvLine, roundedCell } from '$lib/csv';
import { PROPERTY_INFO, labelWithUnit } from '$lib/properties';
import { getDb } from '$lib/server/db';
import type { DbOrTx } from '$lib/server/db/transaction';
import { domainStatistics } from '$lib/site';
import { domainSamples, type DomainSamples } from './domains';
import { getZonation } from './zonations';

/** The distribution columns shared by both tables, after what identifies a row. */
const STAT_HEADERS = ['n', 'mean', 'standard deviation', 'min', 'P10', 'P50', 'P90', 'max'];

/** n, weighted mean and standard deviation, extremes and P10/P50/P90 of values under weights, rounded for people. */
function statCells(values: number[], weights: number[], decimals: number): string[] {
	const s = domainStatistics(values, weights);
	const cell = (v: number) => roundedCell(v, decimals);
	const min = values.length ? Math.min(...values) : NaN;
	const max = values.length ? Math.max(...values) : NaN;
	return [String(s.n), cell(s.mean), cell(s.sd), cell(min), cell(s.p10), cell(s.p50), cell(s.p90), cell(max)];
}

/** Decimals of statistics: one more than the catalogue gives a single reading (a mean is known a little better). */
function decimalsOf(d: DomainSamples): number {
	return PROPERTY_INFO[d.property.key].decimals + 1;
}

/**
 * One domain's statistics as CSV: the pooled distribution with the declustering weights and with equal weights,
 * then each sounding with the same weights renormalised within it and its share of the total weight (%).
 * Statistics as domainStatistics computes them (weighted mean, population standard deviation, quantiles at
 * the weighted plotting positions).
 * @throws ServiceError 404 when the domain is not in the project
 */
export function domainStatisticsCsv(projectId: string, domainId: string, db: DbOrTx = getDb()): { csv: string; name: string } {
	const d = domainSamples(projectId, domainId, db);
	const dec = decimalsOf(d);
	const values = d.samples.value;
	const equal = values.map(() => 1);
	const head = ['soundings', 'weights', 'weight share (%)', ...STAT_HEADERS.map((h) => (h === 'n' ? h : `${h} of ${labelWithUnit(d.property)}`))];
	const declustered = d.domain.declusterCell ? `declustered, ${d.domain.declusterCell.x} ${d.lengthUnit} plan cells` : 'equal (no declustering cell)';
	const rows = [
		csvLine(['all', declustered, values.length ? '100.0' : '', ...statCells(values, d.weights, dec)]),
		csvLine(['all', 'equal', values.length ? '100.0' : '', ...statCells(values, equal, dec)])
	];
	const index = new Map<string, number[]>();
	d.samples.sounding.forEach((s, i) => {
		if (!index.has(s)) index.set(s, []);
		index.get(s)!.push(i);
	});
	for (const [name, idx] of index) {
		const share = idx.reduce((a, i) => a + d.weights[i], 0);
		rows.push(csvLine([name, 'within the sounding', roundedCell(share * 100, 1), ...statCells(idx.map((i) => values[i]), idx.map((i) => d.weights[i]), dec)]));
	}
	return { csv: [csvLine(head), ...rows].join('\r\n') + '\r\n', name: `${d.domain.zonationName}-${d.domain.name}-statistics.csv` };
}

/**
 * A zonation's domains side by side as CSV: each domain's property, members, averaging and declustering
 * settings, soundings and pooled statistics (declustered), with the equal-weight mean beside them.
 * @throws ServiceError 404 when the zonation is not in the project
 */
export function zonationStatisticsCsv(projectId: string, zonationId: string, db: DbOrTx = getDb()): { csv: string; name: string } {
	const z = getZonation(projectId, zonationId, db);
	const head = ['domain', 'property', 'unit', 'units and zones', 'samples', 'declustering cell', 'soundings', ...STAT_HEADERS, 'mean, equal weights'];
	const rows = z.domains.map((domain) => {
		const d = domainSamples(projectId, domain.id, db);
		const dec = decimalsOf(d);
		const info = PROPERTY_INFO[d.property.key];
		const values = d.samples.value;
		const members = domain.members.map((m) => (m.zone === -1 ? m.unitName : `${m.unitName} (${m.zoneName})`)).join('; ');
		const samples = d.domain.cellHeight ? `${d.domain.averaging} over ${d.domain.cellHeight} ${d.lengthUnit}` : 'every reading';
		const cell = d.domain.declusterCell ? `${d.domain.declusterCell.x} ${d.lengthUnit}` : 'equal weights';
		const equalMean = values.length ? values.reduce((a, v) => a + v, 0) / values.length : NaN;
		return csvLine([
			domain.name,
			info.label,
			info.unit,
			members,
			samples,
			cell,
			String(d.soundings.length),
			...statCells(values, d.weights, dec),
			roundedCell(equalMean, dec)
		]);
	});
	return { csv: [csvLine(head), ...rows].join('\r\n') + '\r\n', name: `${z.name}-statistics.csv` };
}
