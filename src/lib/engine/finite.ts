/** Paths (`fieldYears.3.revenueUsd`) of every number in a result that is NaN or infinite. */
export function nonFiniteNumberPaths(value: unknown, limit = 20): string[] {
	const found: string[] = [];
	const walk = (node: unknown, path: string) => {
		if (found.length >= limit) return;
		if (typeof node === 'number') {
			if (!Number.isFinite(node)) found.push(path);
		} else if (Array.isArray(node)) {
			for (let i = 0; i < node.length; i++) walk(node[i], path ? `${path}.${i}` : String(i));
		} else if (node !== null && typeof node === 'object') {
			for (const [key, child] of Object.entries(node)) walk(child, path ? `${path}.${key}` : key);
		}
	};
	walk(value, '');
	return found;
}
