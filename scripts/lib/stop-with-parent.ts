/**
 * Calls `stop` once the process `parent` has gone (checked every second): a helper process must never
 * outlive the app or the test run that started it, even when that one ends without stopping it.
 */
export function stopWithParent(parent: number | undefined, stop: () => void) {
	if (!parent) return;
	setInterval(() => {
		try {
			process.kill(parent, 0);
		} catch {
			stop();
		}
	}, 1000).unref();
}
