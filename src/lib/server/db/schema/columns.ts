import { timestamp } from 'drizzle-orm/pg-core';

/** Creation and update times, the same on every table that a person edits. */
export const timestamps = {
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
	updatedAt: timestamp({ withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date())
};
