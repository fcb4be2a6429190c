// Issue 11, Medium 5: coordinates far beyond the bounds must never make a project's reads fail. New input is
// held to the bounds (tests/integration/uploads.test.ts); data stored before the bounds existed must still read.
import { describe, expect, it } from 'vitest';
import { siteSettings } from '../../../src/lib/server/db/site-schema';
import { updateSite } from '../../../src/lib/server/services/site';
import { locateSounding, projectOntoPolyline } from '../../../src/lib/site';
import { listSoundings } from '../../../src/lib/server/services/soundings';
import { deriveSoundings } from '../../../src/lib/server/services/derived';
import { sectionView } from '../../../src/lib/server/services/stratigraphy';
import { ServiceError } from '../../../src/lib/server/errors';
import { addSounding, siteTestProject } from './site-db';

describe('projectOntoPolyline is total for finite input', () => {
	it('projectOntoPolyline(line, 0, 1e160) gives a finite chainage and offset (squares would overflow)', () => {
		const p = projectOntoPolyline([[0, 0], [100, 0]], 0, 1e160);
		expect(p.chainage).toBe(0);
		expect(p.offset).toBe(-1e160);
	});

	it('projectOntoPolyline on a line of 1e308 coordinates returns a projection instead of throwing', () => {
		expect(() => projectOntoPolyline([[0, 0], [1e308, 1e308]], 5, 5)).not.toThrow();
		const p = projectOntoPolyline([[-1e308, 0], [1e308, 0]], 5, 5);
		expect(p.segment).toBe(0);
	});

	it('locateSounding reports a projection that is not finite as not located', () => {
		const site = { sectionLine: [[-1e308, 0], [1e308, 0]] as [number, number][], offLineTolerance: 25 };
		expect(locateSounding(site, { x: 5, y: 5, chainage: null })).toMatchObject({ chainage: null, source: 'none' });
	});
});

describe('a project holding coordinates from before the bounds', () => {
	it('lists its soundings, derives them and draws the section with a huge easting and a huge section line', () => {
		const { db, projectId } = siteTestProject();
		addSounding(db, projectId, 'FAR', { x: 0, y: 1e160 });
		addSounding(db, projectId, 'NEAR', { x: 50, y: 5 });
		for (const line of [[[0, 0], [100, 0]], [[0, 0], [1e308, 1e308]], [[-1e308, 0], [1e308, 0]]] as [number, number][][]) {
			db.insert(siteSettings).values({ projectId, sectionLine: line }).onConflictDoUpdate({ target: siteSettings.projectId, set: { sectionLine: line } }).run();
			expect(listSoundings(projectId, db)).toHaveLength(2);
			expect(deriveSoundings(projectId, undefined, db)).toHaveLength(2);
			expect(() => sectionView(projectId, 'qc1Ncs', db)).not.toThrow();
		}
	});

	it('updateSite refuses a section line beyond ±1e8 with 422', () => {
		const { db, projectId } = siteTestProject();
		for (const sectionLine of [[[0, 0], [1e308, 1e308]], [[0, 0], [2e8, 0]]] as [number, number][][]) {
			const err = (() => {
				try {
					updateSite(projectId, { sectionLine }, db);
				} catch (e) {
					return e;
				}
			})();
			expect(err).toBeInstanceOf(ServiceError);
			expect((err as ServiceError).status).toBe(422);
		}
		expect(updateSite(projectId, { sectionLine: [[0, 0], [1e8, 0]] }, db).sectionLine).toEqual([[0, 0], [1e8, 0]]);
	});
});
