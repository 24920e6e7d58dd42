/** Paths (`fieldYears.3.revenueUsd`) of every number in a result that is NaN or infinite. */
export function nonFiniteNumberPaths(value: unknown, limit = 20): string[] {
	// A quick pass first: results are almost always clean, and building paths costs more than checking.
	if (allFinite(value)) return [];
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

function allFinite(node: unknown): boolean {
	if (typeof node === 'number') return Number.isFinite(node);
	if (Array.isArray(node)) {
		for (let i = 0; i < node.length; i++) if (!allFinite(node[i])) return false;
		return true;
	}
	if (node !== null && typeof node === 'object') {
		for (const key in node) if (!allFinite((node as Record<string, unknown>)[key])) return false;
	}
	return true;
}
