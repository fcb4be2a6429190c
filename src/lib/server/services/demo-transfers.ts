/**
 * The demo's transfer set: the sands' qc1Ncs carried to relative density and CRR, the clay's su/σ′v to su at the
 * element — the published relations only, so a newcomer's first export carries the model parameters a deformation
 * analysis of the invented levee would read.
 */
import type { DbOrTx } from '$lib/server/db/transaction';
import { saveTransferSet } from './transfers';

export const DEMO_TRANSFER_SET = 'Levee model inputs';

/** Saves the demo transfer set (version 1) and returns its id. */
export function seedDemoTransfers(db: DbOrTx, projectId: string, userId: string): string {
	return saveTransferSet(
		projectId,
		userId,
		{
			name: DEMO_TRANSFER_SET,
			rules: [
				{ property: 'qc1Ncs', domain: null, outputs: [{ relation: 'dr-ib2008' }, { relation: 'crr-bi2014' }] },
				{ property: 'suRatio', domain: null, outputs: [{ relation: 'su-from-ratio' }] }
			],
			note: 'Relative density (Idriss & Boulanger 2008) and CRR at M 7.5, σ′v = 1 atm (Boulanger & Idriss 2014) in the sands; su = su/σ′v × σ′v in the clay.'
		},
		db
	).id;
}
