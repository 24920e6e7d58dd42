// A farm's cash-flow settings: what its monthly cash flow and operating loan start from.
import { relations } from 'drizzle-orm';
import { jsonb, numeric, pgTable, uuid } from 'drizzle-orm/pg-core';
import type { CashFlowSettings } from '../../../schemas/risk';
import { users } from './auth';
import { timestamps } from './columns';
import { farmReference, farms } from './farms';

/**
 * One row per farm, once someone saves them (a farm without one starts from no cash, no minimum and
 * every crop sold at harvest). Farm-level, not per plan: the farm's cash on hand and its marketing
 * habits are the same whatever plan it weighs, so two plans' peak loans differ only by the plans.
 */
export const farmCashFlowSettings = pgTable('farm_cash_flow_settings', {
	farmId: farmReference().primaryKey(),
	/** Cash on hand at the start of a plan's first January. */
	startingCashUsd: numeric({ mode: 'number', precision: 12, scale: 2 }).notNull(),
	/** The lowest balance the farm keeps: the operating loan is drawn to hold it. */
	minimumBalanceUsd: numeric({ mode: 'number', precision: 12, scale: 2 }).notNull(),
	/** The month each crop (by its plan-file key) is sold; a crop left out is sold at harvest. */
	saleMonths: jsonb().$type<CashFlowSettings['saleMonths']>().notNull().default([]),
	updatedById: uuid().references(() => users.id, { onDelete: 'set null' }),
	...timestamps
});

export const farmCashFlowSettingsRelations = relations(farmCashFlowSettings, ({ one }) => ({
	farm: one(farms, { fields: [farmCashFlowSettings.farmId], references: [farms.id] })
}));
