/**
 * Export jobs: large exports (many realizations of a big mesh) written to a file under the data directory by the
 * job runner, with their status and progress stored, cancellable, kept for a stated retention (EXPORT_RETENTION_DAYS,
 * default 7) and deleted after it, and an e-mail to whoever started one when it is done. The file is the same ZIP
 * that export.zip streams for the same request.
 */
import { createReadStream, createWriteStream, mkdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { and, count, desc, eq, gt, inArray, lt } from 'drizzle-orm';
import { CancelledError } from '$lib/cancelled-error';
import { formatDate } from '$lib/dates';
import type { ExportJobRequest } from '$lib/schemas/exports';
import { getDb } from '$lib/server/db';
import { users } from '$lib/server/db/schema';
import { recipes } from '$lib/server/db/recipe-schema';
import { exportJobs, type ExportJobRow, type ExportStatus } from '$lib/server/db/export-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
import { dataDir } from '$lib/server/config';
import { ServiceError } from '$lib/server/errors';
import { InProcessJobRunner, type JobRunner } from '$lib/server/exports/job-runner';
import { sendMail } from '$lib/server/mail';
import { realizationQueue } from '$lib/server/realizations';
import { exportsAtOnce } from '$lib/server/queue';
import { QueueJobRunner } from '$lib/server/queue/job-runner';
import { exportContext, rangeText, zipFileName, zipRequest, zipStream } from './exports';

/** How long a finished export's file is kept: EXPORT_RETENTION_DAYS (default 7). */
export function retentionDays(env: Record<string, string | undefined> = process.env): number {
	const v = Number(env.EXPORT_RETENTION_DAYS);
	return Number.isFinite(v) && v > 0 ? v : 7;
}

/** Where export files are written: <DATA_DIR>/exports. */
export function exportsDir(): string {
	return join(dataDir(), 'exports');
}

/** An export job as the API shows it. */
export interface ExportJobView {
	id: string;
	recipeId: string | null;
	recipeName: string | null;
	recipeHash: string;
	status: ExportStatus;
	/** 0 … 1. */
	progress: number;
	format: 'csv' | 'vtk';
	realizations: string;
	fileName: string;
	bytes: number | null;
	error: string | null;
	createdBy: { id: string; name: string } | null;
	createdAt: string;
	finishedAt: string | null;
	/** When the file is deleted. */
	expiresAt: string | null;
}

/** What a job row stores as its request: the API's body and where to link from its e-mail. */
interface StoredRequest extends ExportJobRequest {
	origin: string;
}

function view(row: ExportJobRow & { recipeName: string | null; userName: string | null; userEmail: string | null }): ExportJobView {
	const req = row.request as StoredRequest;
	return {
		id: row.id,
		recipeId: row.recipeId,
		recipeName: row.recipeName,
		recipeHash: row.recipeHash,
		status: row.status,
		progress: row.progress,
		format: req.format,
		realizations: rangeText(req.realizations).replace(/r/g, '').replace(/_/g, ','),
		fileName: row.fileName,
		bytes: row.bytes,
		error: row.error,
		createdBy: row.createdBy ? { id: row.createdBy, name: row.userName || row.userEmail || 'Unknown' } : null,
		createdAt: row.createdAt.toISOString(),
		finishedAt: row.finishedAt?.toISOString() ?? null,
		expiresAt: row.expiresAt?.toISOString() ?? null
	};
}

function select(db: DbOrTx) {
	return db
		.select({ job: exportJobs, recipeName: recipes.name, userName: users.name, userEmail: users.email })
		.from(exportJobs)
		.leftJoin(recipes, eq(recipes.id, exportJobs.recipeId))
		.leftJoin(users, eq(users.id, exportJobs.createdBy));
}

type Selected = { job: ExportJobRow; recipeName: string | null; userName: string | null; userEmail: string | null };
const flat = (r: Selected) => view({ ...r.job, recipeName: r.recipeName, userName: r.userName, userEmail: r.userEmail });

export function listExports(projectId: string, db: DbOrTx = getDb()): ExportJobView[] {
	return select(db).where(eq(exportJobs.projectId, projectId)).orderBy(desc(exportJobs.createdAt)).all().map(flat);
}

/** @throws ServiceError 404 */
export function getExport(projectId: string, exportId: string, db: DbOrTx = getDb()): ExportJobView {
	const row = select(db)
		.where(and(eq(exportJobs.id, exportId), eq(exportJobs.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Export not found.');
	return flat(row);
}

let runner: JobRunner | null = null;

/**
 * The job runner: the queue's when the realization queue is in use (REDIS_URL), else the in-process one, unless
 * another was given (useJobRunner).
 */
export function jobRunner(): JobRunner {
	if (!runner) {
		const work = (id: string, signal: AbortSignal) => runExportJob(id, signal);
		const queue = realizationQueue();
		runner = queue ? new QueueJobRunner(work, queue, { concurrency: exportsAtOnce() }) : new InProcessJobRunner(work);
	}
	return runner;
}

/** Export jobs that failed in the last 24 hours (the health endpoint, in process). */
export function recentlyFailedExports(now = new Date(), db: DbOrTx = getDb()): number {
	const since = new Date(now.getTime() - 86_400_000);
	return db
		.select({ n: count() })
		.from(exportJobs)
		.where(and(eq(exportJobs.status, 'failed'), gt(exportJobs.finishedAt, since)))
		.get()!.n;
}

/** Runs jobs on `given` instead (a distributed queue, tests). */
export function useJobRunner(given: JobRunner): void {
	runner = given;
}

/**
 * Stores an export job of a recipe and submits it: 202 territory. The request is checked first (recipe, its
 * realizations, the transfer set), so a job that cannot run is refused now rather than failing later.
 * @throws ServiceError 404 for a recipe, realization or transfer set not in the project; 409 as exportContext
 */
export function startExport(projectId: string, userId: string, request: ExportJobRequest, origin: string, db: DbOrTx = getDb()): ExportJobView {
	const ctx = exportContext(projectId, request.recipeId, request.transferSetId, db);
	const req = zipRequest(ctx, { ...request, maps: request.maps });
	const stored: StoredRequest = { ...request, origin };
	const row = db
		.insert(exportJobs)
		.values({ projectId, recipeId: ctx.recipe.id, recipeHash: ctx.recipe.hash, request: stored, fileName: zipFileName(ctx, req), createdBy: userId })
		.returning({ id: exportJobs.id })
		.get();
	jobRunner().submit(row.id);
	return getExport(projectId, row.id, db);
}

/** Path of a job's file (and of the file while it is written). */
function fileOf(id: string, partial = false): string {
	return join(exportsDir(), `${id}.zip${partial ? '.part' : ''}`);
}

function update(id: string, values: Partial<typeof exportJobs.$inferInsert>, db: DbOrTx = getDb()): void {
	db.update(exportJobs).set(values).where(eq(exportJobs.id, id)).run();
}

/**
 * The work of one job (the runner calls it): the ZIP written to <DATA_DIR>/exports/<id>.zip.part and renamed when
 * complete, progress stored at most twice a second, then done with its size and expiry and a mail to its creator;
 * cancelled (the partial file removed) when `signal` aborts; failed with the reason on an error.
 */
export async function runExportJob(id: string, signal: AbortSignal, db: DbOrTx = getDb()): Promise<void> {
	const row = db.select().from(exportJobs).where(eq(exportJobs.id, id)).get();
	if (!row || row.status === 'cancelled' || row.status === 'done' || row.status === 'expired') return;
	if (!row.recipeId) {
		update(id, { status: 'failed', error: 'The recipe was deleted before the export ran.', finishedAt: new Date() }, db);
		return;
	}
	const request = row.request as StoredRequest;
	update(id, { status: 'running', startedAt: new Date(), progress: 0, error: null }, db);
	mkdirSync(exportsDir(), { recursive: true });
	const partial = fileOf(id, true);
	let last = 0;
	try {
		const ctx = exportContext(row.projectId, row.recipeId, request.transferSetId, db);
		const req = zipRequest(ctx, request);
		const zip = zipStream(ctx, req, signal, (done, total) => {
			const now = Date.now();
			if (now - last < 500) return;
			last = now;
			update(id, { progress: Math.min(0.99, done / total) }, db);
		});
		await pipeline(zip, createWriteStream(partial), { signal });
		renameSync(partial, fileOf(id));
		const finishedAt = new Date();
		const expiresAt = new Date(finishedAt.getTime() + retentionDays() * 86_400_000);
		update(id, { status: 'done', progress: 1, bytes: statSync(fileOf(id)).size, finishedAt, expiresAt }, db);
		await notify(row, request, ctx.project.name, ctx.recipe.name, expiresAt, db);
	} catch (err) {
		rmSync(partial, { force: true });
		if (signal.aborted || err instanceof CancelledError || (err as { name?: string }).name === 'AbortError') {
			update(id, { status: 'cancelled', finishedAt: new Date() }, db);
			return;
		}
		console.error('[exports] job', id, err);
		update(id, { status: 'failed', error: err instanceof ServiceError ? err.message : 'The export failed on the server.', finishedAt: new Date() }, db);
	}
}

/** The e-mail of a finished job to whoever started it (the outbox when mail stays local). */
async function notify(row: ExportJobRow, request: StoredRequest, project: string, recipe: string, expiresAt: Date, db: DbOrTx): Promise<void> {
	if (!row.createdBy) return;
	const user = db.select({ email: users.email, name: users.name }).from(users).where(eq(users.id, row.createdBy)).get();
	if (!user) return;
	const link = `${request.origin}/projects/${row.projectId}/exports`;
	try {
		await sendMail({
			to: user.email,
			subject: `Export ready: ${recipe}`,
			text: [
				`Your export of ${recipe} (${project}) is ready: ${row.fileName}.`,
				'',
				`Download it from the Exports page: ${link}`,
				`It is kept until ${formatDate(expiresAt, { utc: true })} (UTC) and deleted after that.`,
				'',
				'These fields support, and do not replace, the judgement of a licensed engineer and the local codes.'
			].join('\n')
		});
	} catch (err) {
		console.error('[exports] mail for job', row.id, err instanceof Error ? err.message : err);
	}
}

/**
 * A finished job's file, to stream as its download.
 * @throws ServiceError 404 for a job not in the project; 409 while it is not done (or its file expired)
 */
export function exportFile(projectId: string, exportId: string, db: DbOrTx = getDb()): { job: ExportJobView; fileName: string; bytes: number; open: () => NodeJS.ReadableStream } {
	const job = getExport(projectId, exportId, db);
	if (job.status !== 'done') throw new ServiceError(409, job.status === 'expired' ? 'This export’s file was deleted at the end of its retention; start it again.' : `This export is ${job.status}; its file is not ready.`);
	const path = fileOf(exportId);
	return { job, fileName: job.fileName, bytes: job.bytes ?? 0, open: () => createReadStream(path) };
}

/**
 * Cancels a queued or running job (it stays listed as cancelled), or deletes a finished one with its file.
 * @throws ServiceError 404; 403 for someone who neither started it nor may edit recipes
 */
export function deleteExport(projectId: string, exportId: string, userId: string, mayEditAll: boolean, db: DbOrTx = getDb()): 'cancelled' | 'deleted' {
	const job = getExport(projectId, exportId, db);
	if (!mayEditAll && job.createdBy?.id !== userId) throw new ServiceError(403, 'Only whoever started an export, or an analyst, may cancel or delete it.');
	if (job.status === 'queued' || job.status === 'running') {
		const known = jobRunner().cancel(exportId);
		// A queued job never started: mark it here; a running one marks itself when it stops.
		if (job.status === 'queued' || !known) update(exportId, { status: 'cancelled', finishedAt: new Date() }, db);
		return 'cancelled';
	}
	rmSync(fileOf(exportId), { force: true });
	db.delete(exportJobs).where(eq(exportJobs.id, exportId)).run();
	return 'deleted';
}

/** Deletes the files of finished jobs past their retention (they stay listed as expired). Returns how many. */
export function sweepExpiredExports(now = new Date(), db: DbOrTx = getDb()): number {
	const rows = db
		.select({ id: exportJobs.id })
		.from(exportJobs)
		.where(and(eq(exportJobs.status, 'done'), lt(exportJobs.expiresAt, now)))
		.all();
	for (const r of rows) {
		rmSync(fileOf(r.id), { force: true });
		update(r.id, { status: 'expired', bytes: null }, db);
	}
	return rows.length;
}

/** At start: jobs a stopped server left queued or running run again from the start; expired files go. */
export function resumeExports(db: DbOrTx = getDb()): void {
	sweepExpiredExports(new Date(), db);
	const rows = db
		.select({ id: exportJobs.id })
		.from(exportJobs)
		.where(inArray(exportJobs.status, ['queued', 'running']))
		.orderBy(exportJobs.createdAt)
		.all();
	for (const r of rows) {
		update(r.id, { status: 'queued', progress: 0 }, db);
		jobRunner().submit(r.id);
	}
	const timer = setInterval(() => sweepExpiredExports(), 3_600_000);
	timer.unref();
}

/** Stops the runner (shutdown). */
export async function stopExports(): Promise<void> {
	await runner?.close();
	runner = null;
}
