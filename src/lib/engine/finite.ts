/** Paths (`fieldYears.3.revenueUsd`) of every number in a result that is NaN or infinite. */
export function nonFiniteNumberPaths(value: unknown, limit = 20): string[] {
	// A quick pass first: results are almost always clean, and building paths costs more than checking.
	if (
		typeof value === 'number'
			? Number.isFinite(value)
			: typeof value !== 'object' || value === null || allFinite(value)
	)
		return [];
	const found: string[] = [];
	const walk = (node: unknown, path: string) => {
		if (found.length >= limit) return;
		if (typeof node === 'number') {
			if (!Number.isFinite(node)) found.push(path);
		} else if (Array.isArray(node)) {
			for (let i = 0; i < node.length; i++) walk(node[i], path ? `${path}.${i}` : String(i));
		} else if (node !== null && typeof node === 'object') {
			for (const key in node) {
				walk((node as Record<string, unknown>)[key], path ? `${path}.${key}` : key);
			}
		}
	};
	walk(value, '');
	return found;
}

/** True when every number below `node` is finite; numbers are checked in the loop, not by a call each. */
function allFinite(node: object): boolean {
	if (Array.isArray(node)) {
		for (let i = 0; i < node.length; i++) {
			const v = node[i];
			if (typeof v === 'number') {
				if (!Number.isFinite(v)) return false;
			} else if (typeof v === 'object' && v !== null && !allFinite(v)) return false;
		}
		return true;
	}
	for (const key in node) {
		const v = (node as Record<string, unknown>)[key];
		if (typeof v === 'number') {
			if (!Number.isFinite(v)) return false;
		} else if (typeof v === 'object' && v !== null && !allFinite(v)) return false;
	}
	return true;
}
