/**
 * The rejection of long work (variograms in the workspace's worker, realizations in a pool) that was
 * cancelled. One class for the app: throw it where the work stops, test for it with `instanceof`.
 */
export class CancelledError extends Error {
	constructor(message = 'cancelled') {
		super(message);
		this.name = 'CancelledError';
	}

	/**
	 * The error as a CancelledError when it is one, also after crossing a worker boundary: comlink hands a
	 * thrown error on as its name, message and stack, not its class, so there the name is what is left to read.
	 * Any other value is returned as it is.
	 */
	static revive(err: unknown): unknown {
		if (err instanceof CancelledError) return err;
		if (err instanceof Error && err.name === 'CancelledError') return new CancelledError(err.message);
		return err;
	}
}
