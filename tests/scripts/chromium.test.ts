import { describe, expect, it } from 'vitest';
import { browserPlan, DEFAULT_CHROMIUM, INSTALL_COMMAND } from '../../scripts/chromium.js';

const machine = { path: DEFAULT_CHROMIUM, explicit: false, executable: false, hasAptGet: true, isRoot: false, canSudo: false };

describe('browserPlan(machine)', () => {
	it('browserPlan(m) goes ahead when the browser is there, whatever else', () => {
		expect(browserPlan({ ...machine, executable: true })).toEqual({ action: 'ok' });
		expect(browserPlan({ ...machine, executable: true, explicit: true, hasAptGet: false })).toEqual({ action: 'ok' });
	});

	it('browserPlan(m) installs Debian\'s chromium as root, or through passwordless sudo, as .ci/run does', () => {
		expect(browserPlan({ ...machine, isRoot: true })).toEqual({
			action: 'install',
			commands: [
				['apt-get', 'update'],
				['env', 'DEBIAN_FRONTEND=noninteractive', 'apt-get', 'install', '-y', '--no-install-recommends', 'chromium']
			]
		});
		const viaSudo = browserPlan({ ...machine, canSudo: true });
		expect(viaSudo.action === 'install' && viaSudo.commands.every((c) => c[0] === 'sudo' && c[1] === '-n')).toBe(true);
	});

	it('browserPlan(m) stops at once with the one command that fixes it when it cannot install', () => {
		for (const m of [machine, { ...machine, hasAptGet: false, isRoot: true }]) {
			expect(browserPlan(m)).toMatchObject({ action: 'stop', message: expect.stringContaining(INSTALL_COMMAND) });
		}
		expect(INSTALL_COMMAND).toBe('sudo apt-get update && sudo apt-get install -y --no-install-recommends chromium');
	});

	it('browserPlan(m) never installs over a CHROMIUM_PATH that points nowhere; it says which path is wrong', () => {
		const plan = browserPlan({ ...machine, path: '/opt/none/chrome', explicit: true, isRoot: true });
		expect(plan).toMatchObject({ action: 'stop', message: expect.stringContaining('/opt/none/chrome') });
	});
});
