// Set-up shared by the fields and crops tests: a farm of a new owner's own, a reviewer of it, and
// snapshots of what the farm holds, to show a refused request changed nothing.
import { readFileSync } from 'node:fs';
import { asc, eq, inArray } from 'drizzle-orm';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';
import type { Db } from '../../src/lib/server/db/client';
import { importPlanDocument } from '../../src/lib/server/db/plan-documents';
import {
	auditLog,
	cropPractices,
	crops,
	farms,
	fieldOperations,
	fields,
	herds,
	people,
	practiceOperations,
	priceSetItems,
	priceSets,
	rotations,
	rotationSteps
} from '../../src/lib/server/db/schema';
import { addMember, createFarm } from '../support/farms';
import { newUser, registerUser, type Client } from '../support/http';

export const farmSettings = (name: string) => ({
	name,
	region: 'Test',
	unitSystem: 'us',
	labourHoursAvailableByMonth: Array(12).fill(200),
	interestRatePercent: 6
});

/** A new owner with a new farm of their own (never the demo farm). */
export async function ownFarm(label: string, unitSystem: 'us' | 'metric' = 'us') {
	const owner = await newUser(label);
	const farmId = await createFarm(owner, { ...farmSettings(`${label} farm`), unitSystem });
	return { owner, farmId };
}

/** A new account made a reviewer of the farm. */
export async function reviewerOf(db: Db, farmId: string, label: string): Promise<Client> {
	const { client, email } = await registerUser(label);
	await addMember(db, farmId, email, 'reviewer');
	return client;
}

/** Imports scenarios/reference.json into the farm: its 14 fields, practices and the plan that uses them. */
export async function importReferencePlan(db: Db, farmId: string) {
	const parsed = parsePlanDocument(JSON.parse(readFileSync('scenarios/reference.json', 'utf8')));
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	await db.transaction((tx) =>
		importPlanDocument(tx, { farmId, userId: null, doc: parsed.plan, isReference: true })
	);
	return parsed.plan;
}

/**
 * Everything a farm set-up request could write for the farm: the farm row (its labour hours follow its
 * people), fields, crops, herd, people, price sets with their items, operations, practices with their
 * operations, rotations with their years, and audit entries.
 */
export async function farmSnapshot(db: Db, farmId: string) {
	const byFarm = <
		T extends
			| typeof fields
			| typeof crops
			| typeof herds
			| typeof people
			| typeof priceSets
			| typeof fieldOperations
			| typeof cropPractices
			| typeof rotations
	>(
		table: T
	) =>
		db
			.select()
			.from(table as typeof fields)
			.where(eq(table.farmId, farmId))
			.orderBy(asc(table.id));
	const [
		farmRows,
		fieldRows,
		cropRows,
		herdRows,
		peopleRows,
		priceSetRows,
		operationRows,
		practiceRows,
		rotationRows,
		auditRows
	] = await Promise.all([
		db.select().from(farms).where(eq(farms.id, farmId)),
		byFarm(fields),
		byFarm(crops),
		byFarm(herds),
		byFarm(people),
		byFarm(priceSets),
		byFarm(fieldOperations),
		byFarm(cropPractices),
		byFarm(rotations),
		db.select().from(auditLog).where(eq(auditLog.farmId, farmId)).orderBy(asc(auditLog.id))
	]);
	const ids = (rows: { id: string }[]) => rows.map((row) => row.id);
	const [priceItemRows, practiceOperationRows, stepRows] = await Promise.all([
		priceSetRows.length
			? db
					.select()
					.from(priceSetItems)
					.where(inArray(priceSetItems.priceSetId, ids(priceSetRows)))
					.orderBy(asc(priceSetItems.priceSetId), asc(priceSetItems.kind), asc(priceSetItems.key))
			: [],
		practiceRows.length
			? db
					.select()
					.from(practiceOperations)
					.where(inArray(practiceOperations.practiceId, ids(practiceRows)))
					.orderBy(asc(practiceOperations.practiceId), asc(practiceOperations.sequence))
			: [],
		rotationRows.length
			? db
					.select()
					.from(rotationSteps)
					.where(inArray(rotationSteps.rotationId, ids(rotationRows)))
					.orderBy(asc(rotationSteps.rotationId), asc(rotationSteps.position))
			: []
	]);
	return {
		farmRows,
		fieldRows,
		cropRows,
		herdRows,
		peopleRows,
		priceSetRows,
		priceItemRows,
		operationRows,
		practiceRows,
		practiceOperationRows,
		rotationRows,
		stepRows,
		auditRows
	};
}
