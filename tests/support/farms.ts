// Farms a test builds for itself, so that it never edits the seeded demo (see after-all/).
import { readFile } from 'node:fs/promises';
import { and, eq } from 'drizzle-orm';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';
import type { Db } from '../../src/lib/server/db/client';
import { importPlanDocument } from '../../src/lib/server/db/plan-documents';
import { farms, memberships, users } from '../../src/lib/server/db/schema';
import { registerUser, type Client } from './http';
import { demoUsers } from './server';

const demoFarmOwners = {
	'Maple Coulee Farm': demoUsers.owner,
	'Birch Hollow Farm': demoUsers.birchHollowOwner
} as const;

/** A seeded demo farm's id, looked up without signing anybody in (by its owner: names can repeat). */
export async function demoFarmId(db: Db, name: keyof typeof demoFarmOwners) {
	const [farm] = await db
		.select({ id: farms.id })
		.from(farms)
		.innerJoin(memberships, eq(memberships.farmId, farms.id))
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(farms.name, name), eq(users.email, demoFarmOwners[name])));
	if (!farm) throw new Error(`The demo farm ${name} is not seeded.`);
	return farm.id;
}

/** Creates a farm through the API as `owner`, like a person using the product. */
export async function createFarm(owner: Client, settings: Record<string, unknown>) {
	const response = await owner.json('/api/v1/farms', 'POST', settings);
	if (response.status !== 201) throw new Error(`creating a farm failed with ${response.status}`);
	const { farm } = (await response.json()) as { farm: { id: string } };
	return farm.id;
}

/** Gives a registered person a role on a farm (no screen does this yet, so it goes to the db). */
export async function addMember(
	db: Db,
	farmId: string,
	email: string,
	role: 'owner' | 'editor' | 'reviewer'
) {
	const user = await db.query.users.findFirst({ where: eq(users.email, email) });
	if (!user) throw new Error(`no account for ${email}`);
	await db.insert(memberships).values({ farmId, userId: user.id, role });
}

/**
 * A new owner with a farm of their own holding everything a scenario file sets up: fields, herd,
 * prices, operations, practices, rotations and the plan.
 */
export async function farmFromScenario(db: Db, file: string, label: string) {
	const parsed = parsePlanDocument(JSON.parse(await readFile(file, 'utf8')));
	if (!parsed.ok) throw new Error(`${file}: ${JSON.stringify(parsed.issues)}`);
	const doc = parsed.plan;
	const { client: owner } = await registerUser(label);
	const farmId = await createFarm(owner, doc.farm);
	await db.transaction((tx) =>
		importPlanDocument(tx, { farmId, userId: null, doc, isReference: true })
	);
	return { owner, farmId };
}
