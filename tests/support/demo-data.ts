// Every stored row that belongs to the seeded demo: the demo people, the farms they are members of as
// seeded, and whatever hangs off those by a foreign key, at any depth. Found from the database's own
// catalogue, so a table added or moved to another schema module is covered without a change here.
import pg from 'pg';
import { demoUsers } from './server';

/** Anything that answers SQL the way `pg` does: a Pool, or a client inside a transaction. */
export interface Queryable {
	query(text: string): Promise<{ rows: unknown[] }>;
}

/** The seeded rows everything else is found from. */
export interface DemoRoots {
	emails: string[];
	userIds: string[];
	farmIds: string[];
}

/** Table name → its demo rows, each row as JSON with every column, in a fixed order. */
export type DemoDump = Record<string, Record<string, unknown>[]>;

const list = (values: string[]) => `(${values.map((v) => pg.escapeLiteral(v)).join(', ')})`;

/** The demo people by e-mail and the farms they are members of (run on the freshly seeded db). */
export async function findDemoRoots(db: Queryable): Promise<DemoRoots> {
	const emails = Object.values(demoUsers);
	const { rows } = await db.query(
		`SELECT
			(SELECT coalesce(array_agg(id::text ORDER BY id), '{}') FROM users WHERE email IN ${list(emails)}) AS "userIds",
			(SELECT coalesce(array_agg(DISTINCT m.farm_id::text), '{}') FROM memberships m
				JOIN users u ON u.id = m.user_id WHERE u.email IN ${list(emails)}) AS "farmIds"`
	);
	const { userIds, farmIds } = rows[0] as { userIds: string[]; farmIds: string[] };
	if (userIds.length !== emails.length || farmIds.length === 0) {
		throw new Error('The demo is not seeded: expected every demo user and their farms.');
	}
	return { emails, userIds, farmIds: [...farmIds].sort() };
}

interface ForeignKey {
	child: string;
	childColumns: string[];
	parent: string;
	parentColumns: string[];
}

/** Tables of the public schema and their foreign keys, names already quoted for SQL. */
async function catalogue(db: Queryable) {
	const tables = await db.query(
		`SELECT c.oid::regclass::text AS name FROM pg_class c
		WHERE c.relkind IN ('r', 'p') AND c.relnamespace = 'public'::regnamespace ORDER BY 1`
	);
	const keys = await db.query(
		`SELECT c.conrelid::regclass::text AS child, c.confrelid::regclass::text AS parent,
			array(SELECT quote_ident(a.attname) FROM unnest(c.conkey) WITH ORDINALITY k(attnum, i)
				JOIN pg_attribute a ON a.attrelid = c.conrelid AND a.attnum = k.attnum ORDER BY k.i) AS "childColumns",
			array(SELECT quote_ident(a.attname) FROM unnest(c.confkey) WITH ORDINALITY k(attnum, i)
				JOIN pg_attribute a ON a.attrelid = c.confrelid AND a.attnum = k.attnum ORDER BY k.i) AS "parentColumns"
		FROM pg_constraint c WHERE c.contype = 'f' AND c.connamespace = 'public'::regnamespace
		ORDER BY c.conname`
	);
	return {
		tables: (tables.rows as { name: string }[]).map((t) => t.name),
		foreignKeys: keys.rows as ForeignKey[]
	};
}

/** SQL conditions that pick a table's demo rows; tables without any have no demo rows. */
function demoConditions(roots: DemoRoots, tables: string[], foreignKeys: ForeignKey[]) {
	const direct = new Map<string, string>([
		['users', `id::text IN ${list(roots.userIds)}`],
		['farms', `id::text IN ${list(roots.farmIds)}`],
		// Rows keyed by e-mail rather than by a foreign key: the sign-in throttle's counters
		// (rate-limiter-flexible keys them `signin:<e-mail>|<address>`) and e-mailed sign-in links.
		[
			'sign_in_limits',
			roots.emails.map((e) => `key LIKE ${pg.escapeLiteral(`%:${e}|%`)}`).join(' OR ')
		],
		['verification_tokens', `identifier IN ${list(roots.emails)}`]
	]);
	const condition = (table: string, path: string[]): string | undefined => {
		const parts = direct.has(table) ? [direct.get(table)!] : [];
		for (const key of foreignKeys) {
			if (key.child !== table || path.includes(key.parent)) continue;
			const parent = condition(key.parent, [...path, table]);
			if (!parent) continue;
			const columns = key.childColumns.join(', ');
			parts.push(
				`(${columns}) IN (SELECT ${key.parentColumns.join(', ')} FROM ${key.parent} WHERE ${parent})`
			);
		}
		return parts.length ? parts.map((p) => `(${p})`).join(' OR ') : undefined;
	};
	return new Map(
		tables.flatMap((table) => {
			const where = condition(table, []);
			return where ? [[table, where] as const] : [];
		})
	);
}

/** Every demo row of every table, each table's rows ordered by their full text, in one statement. */
export async function dumpDemoData(db: Queryable, roots: DemoRoots): Promise<DemoDump> {
	const { tables, foreignKeys } = await catalogue(db);
	const selects = [...demoConditions(roots, tables, foreignKeys)].map(
		([table, where]) =>
			`SELECT ${pg.escapeLiteral(table)} AS name, (SELECT coalesce(json_agg(r ORDER BY r::text), '[]') FROM ${table} r WHERE ${where}) AS rows`
	);
	const { rows } = await db.query(selects.join('\nUNION ALL\n'));
	return Object.fromEntries(
		(rows as { name: string; rows: Record<string, unknown>[] }[]).map((t) => [t.name, t.rows])
	);
}

const shown = (row: Record<string, unknown>) => {
	const text = JSON.stringify(row);
	return text.length > 300 ? `${text.slice(0, 300)}…` : text;
};

/** What differs between two dumps, one line per row; empty when they are the same. */
export function demoDataChanges(before: DemoDump, after: DemoDump): string[] {
	const lines: string[] = [];
	for (const table of [...new Set([...Object.keys(before), ...Object.keys(after)])].sort()) {
		const was = (before[table] ?? []).map((row) => JSON.stringify(row));
		const now = (after[table] ?? []).map((row) => JSON.stringify(row));
		const removed = was.filter((row) => !now.includes(row)).map((row) => JSON.parse(row));
		const added = now.filter((row) => !was.includes(row)).map((row) => JSON.parse(row));
		for (const row of removed) {
			const changed = 'id' in row ? added.find((other) => other.id === row.id) : undefined;
			if (!changed) {
				lines.push(`${table}: row removed ${shown(row)}`);
				continue;
			}
			added.splice(added.indexOf(changed), 1);
			const columns = Object.keys({ ...row, ...changed }).filter(
				(column) => JSON.stringify(row[column]) !== JSON.stringify(changed[column])
			);
			const changes = columns.map(
				(column) => `${column} ${JSON.stringify(row[column])} → ${JSON.stringify(changed[column])}`
			);
			lines.push(`${table} ${row.id}: ${changes.join(', ')}`);
		}
		for (const row of added) lines.push(`${table}: row added ${shown(row)}`);
	}
	return lines;
}
