import type { LayoutServerLoad } from './$types';
import { requireAdmin } from '$lib/server/auth/guard';

export const load: LayoutServerLoad = (event) => {
	requireAdmin(event);
};
