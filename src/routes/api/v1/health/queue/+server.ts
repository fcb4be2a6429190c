import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireAdmin } from '$lib/server/auth/guard';
import { queueHealth } from '$lib/server/queue';
import { jobRunner, recentlyFailedExports } from '$lib/server/services/export-jobs';

/**
 * The realization queue's health, for site admins (session or API token): it names the machines and processes that
 * run workers and counts work across every project. 200 when work can be done, 503 when Redis does not answer or no
 * worker is alive.
 */
export const GET = endpoint(async (event) => {
	requireAdmin(event);
	const health = await queueHealth(jobRunner().counts(), recentlyFailedExports());
	const ok = health.runner === 'in-process' || (!health.error && health.workers.length > 0);
	return json(health, { status: ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
});
