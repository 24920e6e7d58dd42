import { formatNumber } from '$lib/format';
import palette from '../../../../tailwind.config';

const { clover, hearth, loam, straw } = palette.theme.extend.colors;

/** Chart colours from the app's palette: one accent for this plan, a neutral for the one it is set beside. */
export const chartColours = {
	thisPlan: clover[600],
	compared: hearth[500],
	/** A third and fourth plan, should a page compare more. */
	more: [loam[400], straw[500]],
	fieldWork: clover[500],
	chores: loam[400],
	priorCropCredit: straw[400],
	coverCredit: clover[400],
	manureCredit: loam[600],
	nitrogenBought: loam[300],
	grazing: clover[500],
	hay: straw[400],
	/** What is needed or available, drawn as a mark over the bars. */
	mark: hearth[900]
} as const;

/** A series' colour by its place: this plan first, then the compared plan. */
export function seriesColour(index: number): string {
	if (index === 0) return chartColours.thisPlan;
	if (index === 1) return chartColours.compared;
	return chartColours.more[(index - 2) % chartColours.more.length];
}

/** layerchart draws its axes, grid and labels black unless these are set. */
export const chartStyle = [
	`--color-primary: ${clover[600]}`,
	'--color-surface-100: #fff',
	`--color-surface-200: ${hearth[200]}`,
	`--color-surface-300: ${hearth[300]}`,
	`--color-surface-content: ${hearth[700]}`
].join('; ');

/** A legend entry: a filled box for bars, a short rule for a mark drawn over them. */
export interface LegendItem {
	label: string;
	colour: string;
	shape: 'bar' | 'mark';
}

/** The numbers behind a chart: a row per bar group (a year, a month), a column per quantity. */
export interface ChartTable {
	caption: string;
	/** Heads the row labels: "Year", "Month". */
	rowHeader: string;
	/** Each with its unit: "Net return ($)". */
	columns: { label: string; digits?: number }[];
	rows: { label: string; values: (number | null)[] }[];
}

/** A plan's values by year, for a chart that sets plans side by side. */
export interface YearSeries {
	label: string;
	values: number[];
}

/** One data row per year, with each series' value under `s0`, `s1`…: layerchart's wide format. */
export function seriesByYear(years: number[], series: YearSeries[]) {
	return years.map((year, i) => {
		const row: Record<string, number | string> = { year: String(year) };
		series.forEach((s, k) => (row[`s${k}`] = s.values[i]));
		return row;
	});
}

/** "2027 12,300; 2028 −4,100": a series' values for a screen reader, with a unit before or after. */
export function spokenValues(
	labels: (string | number)[],
	values: number[],
	unit: { before?: string; after?: string; digits?: number } = {}
): string {
	const { before = '', after = '', digits = 0 } = unit;
	return labels
		.map((label, i) => {
			const value = values[i];
			const sign = value < 0 ? 'minus ' : '';
			return `${label} ${sign}${before}${formatNumber(Math.abs(value), digits)}${after}`;
		})
		.join('; ');
}

/**
 * Value-axis tick labels for an axis that reaches `top`: whole numbers with thousands separators
 * (1,500), or thousands (40k) on an axis past 10,000, where full figures would crowd a phone's margin.
 */
export function tickFormat(top: number): (value: number) => string {
	if (top < 10_000) return (value) => formatNumber(value);
	return (value) => (value === 0 ? '0' : `${formatNumber(value / 1000)}k`);
}

/** "This plan, Reference plan": series labels in their left-to-right order. */
export function inOrder(series: { label: string }[]): string {
	return series.map((s) => s.label).join(', ');
}

/** Shades for steps of a change, lightest for the smallest: falls in loam browns, rises in clover greens. */
export const stepShades = {
	falls: [loam[300], loam[500], loam[700]],
	rises: [clover[300], clover[500], clover[700]]
} as const;
