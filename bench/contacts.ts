// Keeping interpolated contacts up to date (refreshInterpolatedContacts), which runs after every contact edit,
// upload and section-line change: the demo's size grown by the 175 soundings of a second campaign, 200
// soundings × 4 units, 25 with contacts of their own. One in-memory database, as the service tests use.
import { openDatabase } from '../src/lib/server/db';
import { memberships, projects, users } from '../src/lib/server/db/schema';
import { soundings } from '../src/lib/server/db/site-schema';
import { toFloat64Blob } from '../src/lib/server/db/float64';
import { editContacts, refreshInterpolatedContacts } from '../src/lib/server/services/contacts';
import { createUnit } from '../src/lib/server/services/stratigraphy';
import type { BenchCase } from './index';

const SOUNDINGS = 200;
const OWN = 25;
const REPEATS = 20;

function setUp() {
	const db = openDatabase(':memory:');
	const user = db.insert(users).values({ email: 'bench@conefield.test', name: 'Bench' }).returning().get();
	const project = db.insert(projects).values({ name: 'Bench', createdBy: user.id }).returning().get();
	db.insert(memberships).values({ projectId: project.id, userId: user.id, role: 'owner' }).run();
	const unitIds = ['Clay', 'Plug', 'Sand', 'Dense'].map((name) => createUnit(project.id, { name }, db).id);
	const depth = toFloat64Blob([0.5, 1]);
	const ids: string[] = [];
	for (let k = 0; k < SOUNDINGS; k++) {
		const row = { projectId: project.id, name: `S-${k}`, chainage: k * 2, groundElevation: 4, readings: 2, maxDepth: 1, maxQc: 1, depth, qc: depth, fs: depth };
		ids.push(db.insert(soundings).values(row).returning().get().id);
	}
	const set = [];
	for (let k = 0; k < SOUNDINGS; k += SOUNDINGS / OWN) {
		set.push({ soundingId: ids[k], unitId: unitIds[2], topElevation: 2 - k / 100 }, { soundingId: ids[k], unitId: unitIds[3], topElevation: -6 - k / 100 });
	}
	editContacts(project.id, { set, remove: [], interpolate: [] }, db);
	return { db, projectId: project.id, first: ids[0], sand: unitIds[2] };
}

const cases: BenchCase[] = [
	{
		name: 'contacts-refresh',
		run() {
			const { db, projectId, first, sand } = setUp();
			let ms = 0;
			for (let r = 0; r < REPEATS; r++) {
				// An edit at the first station moves the interpolated tops of the soundings up to the next one.
				const t0 = performance.now();
				editContacts(projectId, { set: [{ soundingId: first, unitId: sand, topElevation: 2 + (r % 2) }], remove: [], interpolate: [] }, db);
				ms += performance.now() - t0;
			}
			let idle = 0;
			for (let r = 0; r < REPEATS; r++) {
				const t0 = performance.now();
				refreshInterpolatedContacts(projectId, db);
				idle += performance.now() - t0;
			}
			return { soundings: SOUNDINGS, units: 4, msEditWithRefresh: ms / REPEATS, msRefreshNothingToDo: idle / REPEATS };
		}
	}
];
export default cases;
