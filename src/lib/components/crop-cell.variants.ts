/** A colour per kind of crop for rotation strips and plan grids (always labelled too: colour is never the only cue). */
const cropCellClass = new Map([
	['corn', 'bg-straw-200 border-straw-400'],
	['soybean', 'bg-clover-100 border-clover-300'],
	['wheat', 'bg-loam-100 border-loam-300'],
	['oats', 'bg-loam-100 border-loam-300'],
	['barley', 'bg-loam-100 border-loam-300'],
	['rye', 'bg-loam-100 border-loam-300'],
	['oat-pea-forage', 'bg-clover-200 border-clover-400'],
	['hay', 'bg-clover-200 border-clover-400']
]);

export function cellClass(cropId: string): string {
	return cropCellClass.get(cropId) ?? 'bg-hearth-100 border-hearth-300';
}
