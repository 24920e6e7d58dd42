import { and, count, eq, inArray, sum } from 'drizzle-orm';
import type { FarmRole } from '$lib/roles';
import type { FarmSettings } from '$lib/schemas/farm';
import { insertAuditEntry } from './audit';
import { readAll, type Db, type Tx } from './client';
import { findFamilyHoursByMonth, lockFarm } from './people';
import {
	cropPractices,
	farms,
	fieldOperations,
	fields,
	herds,
	memberships,
	plans,
	people,
	priceSets,
	rotations,
	users
} from './schema';

/** A farm row as its settings (the farm schema's shape) with its id: what forms and the API show. */
export function farmSettingsOf(farm: typeof farms.$inferSelect): FarmSettings & { id: string } {
	return {
		id: farm.id,
		name: farm.name,
		region: farm.region,
		unitSystem: farm.unitSystem,
		labourHoursAvailableByMonth: farm.labourHoursAvailableByMonth,
		interestRatePercent: farm.interestRatePercent,
		fixedCostsUsdPerYear: farm.fixedCostsUsdPerYear
	};
}

export async function listFarmsForUser(db: Db | Tx, userId: string) {
	return db
		.select({ id: farms.id, name: farms.name, region: farms.region, role: memberships.role })
		.from(memberships)
		.innerJoin(farms, eq(farms.id, memberships.farmId))
		.where(eq(memberships.userId, userId))
		.orderBy(farms.name, farms.id);
}

export async function findMembership(db: Db | Tx, farmId: string, userId: string) {
	return db.query.memberships.findFirst({
		where: and(eq(memberships.farmId, farmId), eq(memberships.userId, userId)),
		with: { farm: true }
	});
}

/** Creates a farm with its creator as owner, and its audit entry, in one transaction. */
export async function createFarm(db: Db | Tx, userId: string, settings: FarmSettings) {
	return db.transaction(async (tx) => {
		const [farm] = await tx
			.insert(farms)
			.values(settings)
			.returning({ id: farms.id, name: farms.name });
		const [membership] = await tx
			.insert(memberships)
			.values({ farmId: farm.id, userId, role: 'owner' })
			.returning({ role: memberships.role });
		await insertAuditEntry(tx, { farmId: farm.id, userId, action: 'farm.created' });
		return { ...farm, role: membership.role };
	});
}

/** Gives more people a role on a farm. */
export async function insertMemberships(
	db: Db | Tx,
	farmId: string,
	members: { userId: string; role: FarmRole }[]
) {
	if (members.length) {
		await db.insert(memberships).values(members.map((member) => ({ ...member, farmId })));
	}
}

/**
 * Saves the farm's settings and its audit entry, together; the settings as saved. A farm with family
 * people keeps their hours summed as its labour hours, whatever hours the settings give.
 */
export async function updateFarm(
	db: Db | Tx,
	farmId: string,
	userId: string,
	settings: FarmSettings
): Promise<FarmSettings> {
	return db.transaction(async (tx) => {
		await lockFarm(tx, farmId);
		const familyHours = await findFamilyHoursByMonth(tx, farmId);
		const saved = {
			...settings,
			labourHoursAvailableByMonth: familyHours ?? settings.labourHoursAvailableByMonth
		};
		await tx.update(farms).set(saved).where(eq(farms.id, farmId));
		await insertAuditEntry(tx, { farmId, userId, action: 'farm.updated' });
		return saved;
	});
}

/** Who can see the farm, owners first. */
export async function listMembers(db: Db | Tx, farmId: string) {
	return db
		.select({ name: users.name, email: users.email, role: memberships.role })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.farmId, farmId))
		.orderBy(memberships.role, users.email);
}

/** How far the farm is set up: one count per part, for the farm home's checklist. */
export async function getFarmSetup(db: Db | Tx, farmId: string) {
	const [
		fieldRows,
		herdRows,
		peopleRows,
		priceRows,
		operationRows,
		practiceRows,
		rotationRows,
		planRows
	] = await readAll(db, [
		() =>
			db
				.select({ n: count(), acres: sum(fields.acres) })
				.from(fields)
				.where(eq(fields.farmId, farmId)),
		() =>
			db
				.select({ n: count(), head: sum(herds.head) })
				.from(herds)
				.where(eq(herds.farmId, farmId)),
		() => db.select({ n: count() }).from(people).where(eq(people.farmId, farmId)),
		() => db.select({ n: count() }).from(priceSets).where(eq(priceSets.farmId, farmId)),
		() => db.select({ n: count() }).from(fieldOperations).where(eq(fieldOperations.farmId, farmId)),
		() => db.select({ n: count() }).from(cropPractices).where(eq(cropPractices.farmId, farmId)),
		() => db.select({ n: count() }).from(rotations).where(eq(rotations.farmId, farmId)),
		() =>
			db
				.select({ n: count(), name: plans.name, isReference: plans.isReference })
				.from(plans)
				.where(eq(plans.farmId, farmId))
				.groupBy(plans.name, plans.isReference)
	]);
	return {
		fields: { count: fieldRows[0].n, acres: Number(fieldRows[0].acres ?? 0) },
		herds: { count: herdRows[0].n, head: Number(herdRows[0].head ?? 0) },
		people: peopleRows[0].n,
		priceSets: priceRows[0].n,
		fieldOperations: operationRows[0].n,
		cropPractices: practiceRows[0].n,
		rotations: rotationRows[0].n,
		plans: planRows.reduce((total, row) => total + row.n, 0),
		referencePlan: planRows.find((row) => row.isReference)?.name ?? null
	};
}

/** Several farms' rows by id (a reviewer's farms). */
export async function listFarmsByIds(db: Db | Tx, farmIds: string[]) {
	if (!farmIds.length) return [];
	return db.query.farms.findMany({ where: inArray(farms.id, farmIds) });
}
