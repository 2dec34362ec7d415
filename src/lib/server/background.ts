// Work a request starts but does not wait for. Pages that must answer the same way, in the same time,
// whether or not an e-mail has an account (sign-up, forgot password) hand their lookups and mail here.
const pending = new Set<Promise<void>>();

/** Starts the task now and returns at once; a failure is logged with its label, never thrown. */
export function runInBackground(label: string, task: () => Promise<void>): void {
	const run = (async () => {
		try {
			await task();
		} catch (e) {
			console.error(`[background] ${label} failed:`, e);
		}
	})();
	pending.add(run);
	void run.finally(() => pending.delete(run));
}

/** Resolves once every task started so far has finished (tests, orderly shutdown). */
export async function backgroundSettled(): Promise<void> {
	while (pending.size) await Promise.all([...pending]);
}
