/**
 * The queue's test bench: Debian's redis-server on a free loopback port (no persistence: a restart loses everything,
 * the hardest case), worker processes started from the BUILT entry (build/worker/queue-worker.js, built here when
 * missing), and app servers (build/index.js) on a shared database, with or without REDIS_URL. Every process started
 * here is stopped by `stopAll()`.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { freePort, waitUntilReady } from './server';

const root = resolve(import.meta.dirname, '..', '..');
export const REDIS_SERVER = process.env.REDIS_SERVER || '/usr/bin/redis-server';
const WORKER = join(root, 'build', 'worker', 'queue-worker.js');

const started = new Set<ChildProcess>();

function exited(child: ChildProcess): Promise<void> {
	return new Promise((done) => (child.exitCode !== null || child.signalCode !== null ? done() : child.once('exit', () => done())));
}

/** Stops a process with `signal`, killing it after `graceMs`; says whether it exited by itself. */
async function stop(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM', graceMs = 5000): Promise<'exited' | 'killed'> {
	if (child.exitCode !== null || child.signalCode !== null) return 'exited';
	child.kill(signal);
	let killed = false;
	const timer = setTimeout(() => {
		killed = true;
		child.kill('SIGKILL');
	}, graceMs);
	await exited(child);
	clearTimeout(timer);
	started.delete(child);
	return killed ? 'killed' : 'exited';
}

/** A process with its output collected. */
function launch(command: string, args: string[], env: Record<string, string>): { child: ChildProcess; log: () => string } {
	const child = spawn(command, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
	started.add(child);
	let text = '';
	child.stdout?.on('data', (d) => (text += d));
	child.stderr?.on('data', (d) => (text += d));
	child.once('exit', () => started.delete(child));
	return { child, log: () => text };
}

export interface TestRedis {
	port: number;
	url: string;
	/** Stops redis-server (SIGTERM: it exits at once, and without persistence everything it held is gone). */
	stop(): Promise<void>;
	/** Starts it again on the same port, empty. */
	start(): Promise<void>;
}

/** Debian's redis-server on a free loopback port, without persistence. */
export async function startRedis(): Promise<TestRedis> {
	if (!existsSync(REDIS_SERVER)) throw new Error(`the queue tests need ${REDIS_SERVER} (sudo apt-get install -y redis-server; .ci/run installs it)`);
	const port = await freePort();
	let proc: ChildProcess | null = null;
	const redis: TestRedis = {
		port,
		url: `redis://127.0.0.1:${port}`,
		async start() {
			const { child, log } = launch(REDIS_SERVER, ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--maxmemory-policy', 'noeviction'], {});
			proc = child;
			const deadline = Date.now() + 10_000;
			while (!/Ready to accept connections/.test(log())) {
				if (child.exitCode !== null) throw new Error(`redis-server exited: ${log()}`);
				if (Date.now() > deadline) throw new Error(`redis-server did not start: ${log()}`);
				await new Promise((r) => setTimeout(r, 50));
			}
		},
		async stop() {
			if (proc) await stop(proc);
			proc = null;
		}
	};
	await redis.start();
	return redis;
}

export interface TestWorker {
	name: string;
	child: ChildProcess;
	log(): string;
	/** Stops it (SIGTERM by default); 'killed' when it had to be killed after 20 s. */
	stop(signal?: NodeJS.Signals): Promise<'exited' | 'killed'>;
}

/** Builds the worker's bundle when it is missing (npm test builds it; a lone vitest run may not have). */
export async function ensureWorkerBuild(): Promise<void> {
	if (existsSync(WORKER)) return;
	const { buildWorker } = await import(join(root, 'scripts', 'build-worker.js'));
	await buildWorker();
}

/** A worker process from the built entry, one simulation thread, short locks; resolves once it has connected. */
export async function startWorker(url: string, name: string, env: Record<string, string> = {}): Promise<TestWorker> {
	await ensureWorkerBuild();
	const { child, log } = launch(process.execPath, [WORKER], { REDIS_URL: url, WORKER_NAME: name, WORKER_THREADS: '1', WORKER_LOCK_MS: '2000', ...env });
	const deadline = Date.now() + 20_000;
	while (!/connected to/.test(log())) {
		if (child.exitCode !== null) throw new Error(`worker ${name} exited: ${log()}`);
		if (Date.now() > deadline) throw new Error(`worker ${name} did not connect: ${log()}`);
		await new Promise((r) => setTimeout(r, 50));
	}
	return { name, child, log, stop: (signal = 'SIGTERM') => stop(child, signal, 20_000) };
}

export interface TestApp {
	baseUrl: string;
	log(): string;
	/** SIGTERM; 'killed' when it had not exited within 10 s. */
	stop(): Promise<'exited' | 'killed'>;
}

/** A fresh data directory (database and export files) for servers that share it. */
export function freshDataDir(): string {
	return mkdtempSync(join(tmpdir(), 'conefield-queue-'));
}

/** The built app on a free loopback port, over `dataDir`'s database; `env` adds REDIS_URL and the like. */
export async function startApp(dataDir: string, env: Record<string, string>): Promise<TestApp> {
	const port = await freePort();
	const baseUrl = `http://127.0.0.1:${port}`;
	const { child, log } = launch(process.execPath, [join(root, 'build', 'index.js')], {
		PORT: String(port),
		HOST: '127.0.0.1',
		ORIGIN: baseUrl,
		DATABASE_URL: join(dataDir, 'conefield.db'),
		DATA_DIR: dataDir,
		SMTP_URL: '',
		AUTH_SECRET: '',
		REDIS_URL: '',
		...env
	});
	try {
		await waitUntilReady(baseUrl, child);
	} catch (err) {
		await stop(child, 'SIGKILL');
		throw new Error(`${(err as Error).message}\n--- server log ---\n${log()}`);
	}
	return { baseUrl, log, stop: () => stop(child, 'SIGTERM', 10_000) };
}

/** Stops every process started here that is still running. */
export async function stopAll(): Promise<void> {
	await Promise.all([...started].map((c) => stop(c, 'SIGKILL')));
}
