/** Number formats for tables: one place, so every figure on a page reads the same way. */
const formatters = new Map<number, Intl.NumberFormat>();

export function formatNumber(value: number | null | undefined, digits = 0): string {
	if (value === null || value === undefined || Number.isNaN(value)) return '—';
	let formatter = formatters.get(digits);
	if (!formatter) {
		formatter = new Intl.NumberFormat('en-US', {
			minimumFractionDigits: digits,
			maximumFractionDigits: digits
		});
		formatters.set(digits, formatter);
	}
	return formatter.format(value);
}

/** Dollars with the sign before the symbol, as budgets print them: $1,200 and −$1,200. */
export function formatUsd(value: number | null | undefined, digits = 0): string {
	if (value === null || value === undefined || Number.isNaN(value)) return '—';
	return `${value < 0 ? '−' : ''}$${formatNumber(Math.abs(value), digits)}`;
}
