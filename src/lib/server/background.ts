const pending = new Set<Promise<void>>();

/**
 * Runs work after the response, for requests that must answer alike whatever the work finds (the e-mail
 * sign-in form). Failures are logged; `settleBackground()` waits for what is still running, at shutdown.
 */
export function inBackground(label: string, work: () => Promise<void>): void {
	const run: Promise<void> = new Promise<void>((resolve) => setImmediate(resolve))
		.then(work)
		.catch((err: unknown) => console.error(`[${label}]`, err instanceof Error ? err.message : err))
		.finally(() => pending.delete(run));
	pending.add(run);
}

/** Waits for all background work to finish. */
export async function settleBackground(): Promise<void> {
	while (pending.size > 0) await Promise.allSettled([...pending]);
}
