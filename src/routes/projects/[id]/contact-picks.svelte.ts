// Contacts picked by clicking a profile or the section, each one undoable (last picked, first undone).
import type { ProjectApi } from '$lib/api';
import type { ContactSource } from '$lib/site';

/** A sounding as a pick needs it. */
export interface PickSounding {
	id: string;
	name: string;
	/** Its contacts follow its neighbours (none of its own yet). */
	contactsInterpolated: boolean;
}

/** A unit as it stood at the sounding before the pick. */
export interface PickUnit {
	id: string;
	name: string;
	topElevation: number | null;
	topSource: ContactSource | null;
}

/** One pick, with what it replaced so it can be put back. */
export interface PickRecord {
	soundingId: string;
	soundingName: string;
	unitId: string;
	unitName: string;
	topElevation: number;
	/** The stored top it replaced; null when the unit had none (absent, or the top unit's ground default). */
	before: number | null;
	/** The sounding's contacts followed its neighbours before the pick. */
	followed: boolean;
}

export class ContactPicks {
	/** Picks that can still be undone, oldest first. */
	done = $state<PickRecord[]>([]);
	readonly last = $derived(this.done.length ? this.done[this.done.length - 1] : null);

	constructor(private readonly api: Pick<ProjectApi, 'editContacts'>) {}

	/** Sets the unit's top at the sounding and remembers what was there. @throws {RequestFailed} when refused */
	async pick(sounding: PickSounding, unit: PickUnit, topElevation: number): Promise<PickRecord> {
		const stored = unit.topSource === 'measured' || unit.topSource === 'interpolated';
		const record: PickRecord = {
			soundingId: sounding.id,
			soundingName: sounding.name,
			unitId: unit.id,
			unitName: unit.name,
			topElevation,
			before: stored ? unit.topElevation : null,
			followed: sounding.contactsInterpolated
		};
		await this.api.editContacts({ set: [{ soundingId: sounding.id, unitId: unit.id, topElevation }] });
		this.done = [...this.done, record];
		return record;
	}

	/**
	 * Puts back what the last pick replaced: the sounding follows its neighbours again if it did, else the
	 * previous top is set (as entered) or the contact removed. @throws {RequestFailed} when refused
	 */
	async undo(): Promise<PickRecord | null> {
		const r = this.last;
		if (!r) return null;
		const { soundingId, unitId } = r;
		if (r.followed) await this.api.editContacts({ interpolate: [soundingId] });
		else if (r.before !== null) await this.api.editContacts({ set: [{ soundingId, unitId, topElevation: r.before }] });
		else await this.api.editContacts({ remove: [{ soundingId, unitId }] });
		this.done = this.done.slice(0, -1);
		return r;
	}
}
