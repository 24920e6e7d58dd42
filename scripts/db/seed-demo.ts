// Seeds the invented demo: Maple Coulee Farm, its people, a lender and a site administrator.
// Demo-only: it refuses to run unless FURROWCAST_DEMO=1 (set by `npm start` and `npm test` in .env).
import './load-env';
import { readFileSync, readdirSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import type { FarmRole } from '../../src/lib/roles';
import type { FarmSettings } from '../../src/lib/schemas/farm';
import {
	familyHoursByMonth,
	parsePlanDocument,
	type Person as Worker,
	type PlanDocument
} from '../../src/lib/schemas/plan-file';
import { hashPassword } from '../../src/lib/server/auth/password';
import { createDb } from '../../src/lib/server/db/client';
import { createFarm, insertMemberships } from '../../src/lib/server/db/farms';
import { insertPeople } from '../../src/lib/server/db/people';
import { importPlanDocument } from '../../src/lib/server/db/plan-documents';
import { users } from '../../src/lib/server/db/schema';

export const DEMO_PASSWORD = 'furrowcast-demo';

const people = {
	owner: { email: 'owner@furrowcast.test', name: 'Ruth Halvorsen' },
	partner: { email: 'partner@furrowcast.test', name: 'Tomas Halvorsen' },
	lender: { email: 'lender@furrowcast.test', name: 'Dana Whitcombe' },
	admin: { email: 'admin@furrowcast.test', name: 'Site Administrator', isSiteAdmin: true },
	neighbour: { email: 'birchhollow@furrowcast.test', name: 'Abel Marsh' }
};

type Person = keyof typeof people;
/** Who creates the farm (its owner) and who else is given a role on it. */
interface People {
	owner: Person;
	others: [Person, FarmRole][];
}

const mapleCouleePeople: People = {
	owner: 'owner',
	others: [
		['partner', 'editor'],
		['lender', 'reviewer']
	]
};

/**
 * Who works on Maple Coulee Farm (invented). The family's hours sum, month by month, to the farm's
 * labour hours in scenarios/reference.json; the hired hand is paid by the hour.
 */
const mapleCouleeWorkers: Worker[] = [
	{
		id: 'ruth',
		name: 'Ruth Halvorsen',
		role: 'operator',
		hoursAvailableByMonth: [120, 120, 130, 170, 190, 180, 170, 170, 180, 200, 150, 120],
		wageUsdPerHour: null,
		notes: ''
	},
	{
		id: 'tomas',
		name: 'Tomas Halvorsen',
		role: 'partner',
		hoursAvailableByMonth: [60, 60, 60, 90, 120, 100, 80, 80, 110, 130, 80, 60],
		wageUsdPerHour: null,
		notes: 'Drives school bus mornings and afternoons in the school year.'
	},
	{
		id: 'signe',
		name: 'Signe Halvorsen',
		role: 'family',
		hoursAvailableByMonth: [20, 20, 30, 40, 50, 40, 50, 50, 50, 50, 30, 20],
		wageUsdPerHour: null,
		notes: 'Fifteen; after school and weekends.'
	},
	{
		id: 'wade',
		name: 'Wade Kessler',
		role: 'hired',
		hoursAvailableByMonth: [0, 0, 0, 40, 80, 40, 20, 20, 40, 80, 0, 0],
		wageUsdPerHour: 18.5,
		notes: 'Part-time in planting and harvest.'
	}
];

// A second client farm of the lender's, with settings only. Invented figures.
const birchHollow: { settings: FarmSettings; people: People } = {
	settings: {
		name: 'Birch Hollow Farm',
		region: 'Upper Midwest',
		unitSystem: 'us',
		labourHoursAvailableByMonth: [160, 160, 180, 240, 280, 240, 220, 220, 240, 280, 220, 160],
		interestRatePercent: 7,
		fixedCostsUsdPerYear: 90000
	},
	people: { owner: 'neighbour', others: [['lender', 'reviewer']] }
};

/** The demo farm's plan files; `reference.json` is its reference plan. */
function demoPlans(): { file: string; doc: PlanDocument }[] {
	return readdirSync('scenarios')
		.filter((file) => file.endsWith('.json'))
		.sort(
			(a, b) =>
				Number(b === 'reference.json') - Number(a === 'reference.json') || a.localeCompare(b)
		)
		.map((file) => {
			const parsed = parsePlanDocument(JSON.parse(readFileSync(`scenarios/${file}`, 'utf8')));
			if (!parsed.ok) throw new Error(`scenarios/${file}: ${JSON.stringify(parsed.issues)}`);
			return { file, doc: parsed.plan };
		});
}

if (process.env.FURROWCAST_DEMO !== '1') {
	console.error(
		'Refusing to seed demo accounts: set FURROWCAST_DEMO=1 (only for a demo or test database).'
	);
	process.exit(1);
}
const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set');
const { db, pool } = createDb(url);

try {
	const existing = await db.query.users.findFirst({ where: eq(users.email, people.owner.email) });
	if (existing) {
		console.log('demo data already present');
	} else {
		const passwordHash = await hashPassword(DEMO_PASSWORD);
		const plans = demoPlans();
		await db.transaction(async (tx) => {
			const ids = new Map<Person, string>();
			for (const [key, person] of Object.entries(people) as [Person, (typeof people)[Person]][]) {
				const [row] = await tx
					.insert(users)
					.values({ ...person, passwordHash, emailVerified: new Date() })
					.returning({ id: users.id });
				ids.set(key, row.id);
			}
			const idOf = (person: Person) => ids.get(person)!;
			// The app's own farm creation (owner membership and audit entry), then the other roles.
			const addFarm = async (settings: FarmSettings, { owner, others }: People) => {
				const farm = await createFarm(tx, idOf(owner), settings);
				await insertMemberships(
					tx,
					farm.id,
					others.map(([person, role]) => ({ userId: idOf(person), role }))
				);
				return farm.id;
			};
			// Maple Coulee Farm is its plan files (settings, fields, herd, prices, practices, plans) and its people.
			const reference = plans.find(({ file }) => file === 'reference.json');
			if (!reference) throw new Error('scenarios/reference.json is missing');
			const summed = familyHoursByMonth(mapleCouleeWorkers);
			if (summed.some((h, m) => h !== reference.doc.farm.labourHoursAvailableByMonth[m])) {
				throw new Error(`The demo family's hours (${summed}) are not the farm's labour hours.`);
			}
			const mapleCouleeId = await addFarm(reference.doc.farm, mapleCouleePeople);
			for (const { file, doc } of plans) {
				await importPlanDocument(tx, {
					farmId: mapleCouleeId,
					userId: idOf('owner'),
					doc,
					isReference: file === 'reference.json'
				});
			}
			await insertPeople(tx, mapleCouleeId, mapleCouleeWorkers);
			await addFarm(birchHollow.settings, birchHollow.people);
		});
		console.log('demo data seeded');
	}
} finally {
	await pool.end();
}
