import type { FieldIssue } from './issues';

/**
 * Format 1 of the plan file, read by upgrading it to format 2 before parsing:
 * - own operations were always stated by machine: they gain `statedAs: "machine"`;
 * - residue grazing gave `leafHuskLbDmPerBu`, defaulting to 16 for every grain (UNL, Rasby 2007):
 *   format 2 names it `leafHuskLbDmPerUnit` and takes the crop's own figure when it is left out, so
 *   the upgrade writes format 1's value out;
 * - crops of a file's own did not exist.
 */

// Format 1's default leaf and husk per bushel for every grain (UNL, Rasby 2007; CropWatch).
const format1LeafHuskLbDmPerBu = 16;

type Upgrade =
	| { ok: true; document: unknown; pathInFormat1: (issue: FieldIssue) => FieldIssue }
	| { ok: false; issues: FieldIssue[] };

const isRecord = (value: unknown): value is Record<string, unknown> =>
	typeof value === 'object' && value !== null && !Array.isArray(value);

export function upgradeFormat1(input: object): Upgrade {
	const doc = structuredClone(input) as Record<string, unknown>;
	if ('crops' in doc) {
		return {
			ok: false,
			issues: [{ path: 'crops', message: 'Crops of your own need formatVersion 2.' }]
		};
	}
	doc.formatVersion = 2;
	if (Array.isArray(doc.operations)) {
		for (const operation of doc.operations) {
			if (isRecord(operation) && operation.by === 'own' && !('statedAs' in operation)) {
				operation.statedAs = 'machine';
			}
		}
	}
	if (Array.isArray(doc.practices)) {
		for (const practice of doc.practices) {
			if (!isRecord(practice) || !isRecord(practice.residueGrazing)) continue;
			const { leafHuskLbDmPerBu, ...rest } = practice.residueGrazing;
			practice.residueGrazing = {
				...rest,
				leafHuskLbDmPerUnit: leafHuskLbDmPerBu ?? format1LeafHuskLbDmPerBu
			};
		}
	}
	return {
		ok: true,
		document: doc,
		pathInFormat1: ({ path, message }) => ({
			path: path.replace(
				/\.residueGrazing\.leafHuskLbDmPerUnit$/,
				'.residueGrazing.leafHuskLbDmPerBu'
			),
			message
		})
	};
}
