// Set-up shared by the fields and crops tests: a farm of a new owner's own, a reviewer of it, and
// snapshots of what the farm holds, to show a refused request changed nothing.
import { readFileSync } from 'node:fs';
import { asc, eq } from 'drizzle-orm';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';
import type { Db } from '../../src/lib/server/db/client';
import { importPlanDocument } from '../../src/lib/server/db/plan-documents';
import { auditLog, crops, farms, fields, herds, people } from '../../src/lib/server/db/schema';
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
 * Everything a farm set-up request could write for the farm: its row (labour hours), fields, crops,
 * herd, people and audit entries.
 */
export async function farmSnapshot(db: Db, farmId: string) {
	const [farmRows, fieldRows, cropRows, herdRows, peopleRows, auditRows] = await Promise.all([
		db.select().from(farms).where(eq(farms.id, farmId)),
		db.select().from(fields).where(eq(fields.farmId, farmId)).orderBy(asc(fields.id)),
		db.select().from(crops).where(eq(crops.farmId, farmId)).orderBy(asc(crops.id)),
		db.select().from(herds).where(eq(herds.farmId, farmId)),
		db.select().from(people).where(eq(people.farmId, farmId)).orderBy(asc(people.id)),
		db.select().from(auditLog).where(eq(auditLog.farmId, farmId)).orderBy(asc(auditLog.id))
	]);
	return { farmRows, fieldRows, cropRows, herdRows, peopleRows, auditRows };
}
