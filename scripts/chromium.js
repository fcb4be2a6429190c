// Before `npm test` runs for minutes: is the Chromium that the browser tests drive (playwright-core with
// Debian's /usr/bin/chromium, or CHROMIUM_PATH) there, and if not, can it be installed as .ci/run would?
import { accessSync, constants, existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';

export const DEFAULT_CHROMIUM = '/usr/bin/chromium';
/** The one command that installs Debian's Chromium by hand. */
export const INSTALL_COMMAND = 'sudo apt-get update && sudo apt-get install -y --no-install-recommends chromium';

/**
 * What to do about the browser, from what the machine offers (no side effects):
 * 'ok' when it is there; 'install' with the apt-get commands when it is missing at the default path and
 * apt-get can run as root (directly or by passwordless sudo); otherwise 'stop' with the message that says
 * how to fix it. A CHROMIUM_PATH that points nowhere is never "fixed" by installing Debian's package.
 * @param {{ path: string, explicit: boolean, executable: boolean, hasAptGet: boolean, isRoot: boolean, canSudo: boolean }} m
 * @returns {{ action: 'ok' } | { action: 'install', commands: string[][] } | { action: 'stop', message: string }}
 */
export function browserPlan({ path, explicit, executable, hasAptGet, isRoot, canSudo }) {
	if (executable) return { action: 'ok' };
	if (explicit) {
		return { action: 'stop', message: `CHROMIUM_PATH is ${path}, which is not an executable file. Point it at a Chromium or Chrome binary, or unset it to use ${DEFAULT_CHROMIUM}.` };
	}
	if (hasAptGet && (isRoot || canSudo)) {
		const sudo = isRoot ? [] : ['sudo', '-n'];
		return {
			action: 'install',
			commands: [
				[...sudo, 'apt-get', 'update'],
				[...sudo, 'env', 'DEBIAN_FRONTEND=noninteractive', 'apt-get', 'install', '-y', '--no-install-recommends', 'chromium']
			]
		};
	}
	return {
		action: 'stop',
		message: [
			`The browser tests drive Chromium at ${DEFAULT_CHROMIUM}, and it is not installed. Install it (Debian or Ubuntu) with:`,
			'',
			`  ${INSTALL_COMMAND}`,
			'',
			'or set CHROMIUM_PATH to a Chromium or Chrome binary, then run npm test again.'
		].join('\n')
	};
}

/** What this machine offers, for browserPlan. */
export function probeMachine(env = process.env) {
	const path = env.CHROMIUM_PATH || DEFAULT_CHROMIUM;
	let executable = false;
	try {
		accessSync(path, constants.X_OK);
		executable = true;
	} catch {
		executable = false;
	}
	const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
	const hasAptGet = existsSync('/usr/bin/apt-get');
	const canSudo = !isRoot && spawnSync('sudo', ['-n', 'true'], { stdio: 'ignore' }).status === 0;
	return { path, explicit: Boolean(env.CHROMIUM_PATH), executable, hasAptGet, isRoot, canSudo };
}

/** Makes sure the browser is there (installing it when it can); false, with the fix printed, when it is not. */
export function ensureChromium() {
	const machine = probeMachine();
	const plan = browserPlan(machine);
	if (plan.action === 'ok') return true;
	if (plan.action === 'stop') {
		console.error(`\n✖ ${plan.message}\n`);
		return false;
	}
	console.log(`\n▶ installing Chromium for the browser tests (${machine.path} is missing)`);
	for (const [cmd, ...args] of plan.commands) {
		const r = spawnSync(cmd, args, { stdio: 'inherit' });
		if (r.status !== 0) {
			console.error(`\n✖ ${[cmd, ...args].join(' ')} failed. Install Chromium by hand:\n\n  ${INSTALL_COMMAND}\n`);
			return false;
		}
	}
	return browserPlan(probeMachine()).action === 'ok';
}
