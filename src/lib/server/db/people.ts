import { and, asc, eq, ne } from 'drizzle-orm';
import { keyFromName } from '$lib/schemas/farm-setup';
import type { PersonBody } from '$lib/schemas/people';
import { familyHoursByMonth, type Person } from '$lib/schemas/plan-file';
import { isFamilyLabour } from '$lib/farm-lists';
import { farmSchema } from '$lib/schemas/farm';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { isRowId } from './keys';
import { farms, people } from './schema';

/** A person as the API and the people page give them: the row id, the plan-file id as `key`, the rest. */
export type PersonRow = Omit<PersonBody, 'key'> & { id: string; key: string };

const personColumns = {
	id: true,
	key: true,
	name: true,
	role: true,
	hoursAvailableByMonth: true,
	wageUsdPerHour: true,
	notes: true
} as const;

const personReturning = {
	id: people.id,
	key: people.key,
	name: people.name,
	role: people.role,
	hoursAvailableByMonth: people.hoursAvailableByMonth,
	wageUsdPerHour: people.wageUsdPerHour,
	notes: people.notes
};

/** The farm's people: operator, partners, family, then hired help (the role list's order), by name. */
export async function listPeople(db: Db | Tx, farmId: string): Promise<PersonRow[]> {
	return db.query.people.findMany({
		columns: personColumns,
		where: eq(people.farmId, farmId),
		orderBy: [asc(people.role), asc(people.name), asc(people.key)]
	});
}

/** One of the farm's people; undefined for another farm's person or an id that is not a UUID. */
export async function findPersonById(
	db: Db | Tx,
	farmId: string,
	personId: string
): Promise<PersonRow | undefined> {
	if (!isRowId(personId)) return undefined;
	return db.query.people.findFirst({
		columns: personColumns,
		where: and(eq(people.farmId, farmId), eq(people.id, personId))
	});
}

/**
 * The operator's, partners' and family's hours summed by month, or null when the farm has no family
 * people (then the farm's labour hours are typed in its settings).
 */
export async function findFamilyHoursByMonth(db: Db | Tx, farmId: string) {
	const rows = await db
		.select({ role: people.role, hoursAvailableByMonth: people.hoursAvailableByMonth })
		.from(people)
		.where(eq(people.farmId, farmId));
	return rows.some((row) => isFamilyLabour(row.role)) ? familyHoursByMonth(rows) : null;
}

/**
 * Locks the farm's row for the rest of the transaction, so people writes and settings saves take turns
 * and the farm's labour hours are always the sum of the people saved last.
 */
export async function lockFarm(tx: Tx, farmId: string) {
	await tx.select({ id: farms.id }).from(farms).where(eq(farms.id, farmId)).for('update');
}

// The farm's own bound on labour hours in a month, so the summed hours are always valid farm settings.
const maxFarmHoursInMonth = farmSchema.shape.labourHoursAvailableByMonth.element.maxValue ?? 0;

/** A people write that would sum the family's hours past what a farm's settings may hold. */
export class FamilyHoursTooHigh extends Error {
	constructor(
		readonly month: number,
		readonly hours: number,
		readonly max = maxFarmHoursInMonth
	) {
		super(`family hours in month ${month + 1} would be ${hours}`);
	}
}

/**
 * Sets the farm's labour hours to the family's summed, when it has family people (call it locked);
 * throws FamilyHoursTooHigh, rolling the transaction back, when a month's sum is past the farm's bound.
 */
export async function updateFarmLabourFromPeople(tx: Tx, farmId: string) {
	const hours = await findFamilyHoursByMonth(tx, farmId);
	if (!hours) return;
	const month = hours.findIndex((h) => h > maxFarmHoursInMonth);
	if (month >= 0) throw new FamilyHoursTooHigh(month, hours[month]);
	await tx.update(farms).set({ labourHoursAvailableByMonth: hours }).where(eq(farms.id, farmId));
}

/** The saved person, or the month the family's hours would run past the farm's bound (nothing saved). */
export type PersonWrite = { person: PersonRow } | { tooHigh: FamilyHoursTooHigh };

async function refusingTooHigh(write: () => Promise<PersonRow>): Promise<PersonWrite> {
	try {
		return { person: await write() };
	} catch (err) {
		if (err instanceof FamilyHoursTooHigh) return { tooHigh: err };
		throw err;
	}
}

/**
 * The plan-file id a person saves under: `wanted` when no other person of the farm has it (undefined
 * when one does), else one made from the name. `personId` is the person being changed.
 */
export async function choosePersonKey(
	db: Db | Tx,
	farmId: string,
	{ name, wanted, personId }: { name: string; wanted?: string; personId?: string }
): Promise<string | undefined> {
	const rows = await db
		.select({ key: people.key })
		.from(people)
		.where(and(eq(people.farmId, farmId), personId ? ne(people.id, personId) : undefined));
	const taken = new Set(rows.map((row) => row.key));
	if (wanted !== undefined) return taken.has(wanted) ? undefined : wanted;
	return keyFromName(name, taken, 'person');
}

/**
 * Adds one person (key chosen and free), then the farm's labour hours and the audit entry, together;
 * nothing when the family's hours would run past the farm's bound.
 */
export async function insertPerson(
	db: Db | Tx,
	farmId: string,
	userId: string,
	person: PersonBody & { key: string }
): Promise<PersonWrite> {
	return refusingTooHigh(() =>
		db.transaction(async (tx) => {
			await lockFarm(tx, farmId);
			const [row] = await tx
				.insert(people)
				.values({ ...person, farmId })
				.returning(personReturning);
			await updateFarmLabourFromPeople(tx, farmId);
			await insertAuditEntry(tx, {
				farmId,
				userId,
				action: 'person.created',
				detail: { personId: row.id, name: row.name }
			});
			return row;
		})
	);
}

/** Replaces a person's values (key checked free), then the farm's labour hours and the audit entry, or nothing. */
export async function updatePerson(
	db: Db | Tx,
	farmId: string,
	userId: string,
	personId: string,
	person: PersonBody & { key: string }
): Promise<PersonWrite> {
	return refusingTooHigh(() =>
		db.transaction(async (tx) => {
			await lockFarm(tx, farmId);
			const [row] = await tx
				.update(people)
				.set(person)
				.where(and(eq(people.farmId, farmId), eq(people.id, personId)))
				.returning(personReturning);
			await updateFarmLabourFromPeople(tx, farmId);
			await insertAuditEntry(tx, {
				farmId,
				userId,
				action: 'person.updated',
				detail: { personId, name: row.name }
			});
			return row;
		})
	);
}

/**
 * Deletes a person, then sums the family's hours again and records it, together. When the last family
 * person goes, the farm keeps the hours it had (its settings can change them again).
 */
export async function deletePerson(
	db: Db | Tx,
	farmId: string,
	userId: string,
	person: Pick<PersonRow, 'id' | 'name'>
) {
	await db.transaction(async (tx) => {
		await lockFarm(tx, farmId);
		await tx.delete(people).where(and(eq(people.farmId, farmId), eq(people.id, person.id)));
		await updateFarmLabourFromPeople(tx, farmId);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'person.deleted',
			detail: { personId: person.id, name: person.name }
		});
	});
}

/** Adds a plan file's people the farm does not have yet (by plan-file id), then sums the family's hours. */
export async function insertPeople(tx: Tx, farmId: string, input: Person[]) {
	if (!input.length) return;
	await lockFarm(tx, farmId);
	await tx
		.insert(people)
		.values(input.map(({ id, ...person }) => ({ ...person, farmId, key: id })))
		.onConflictDoNothing();
	await updateFarmLabourFromPeople(tx, farmId);
}

/** The farm's people as a plan file's `people`. */
export async function exportPeople(db: Db | Tx, farmId: string): Promise<Person[]> {
	const rows = await listPeople(db, farmId);
	return rows.map(({ id: _id, key, ...person }) => ({ id: key, ...person }));
}
