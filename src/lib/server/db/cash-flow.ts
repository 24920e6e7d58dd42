import { eq } from 'drizzle-orm';
import { defaultCashFlowSettings, type CashFlowSettings } from '$lib/schemas/risk';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { farmCashFlowSettings } from './schema';

/** The farm's cash-flow settings, or the defaults when it has saved none. */
export async function findCashFlowSettings(db: Db | Tx, farmId: string): Promise<CashFlowSettings> {
	const [row] = await db
		.select({
			startingCashUsd: farmCashFlowSettings.startingCashUsd,
			minimumBalanceUsd: farmCashFlowSettings.minimumBalanceUsd,
			saleMonths: farmCashFlowSettings.saleMonths
		})
		.from(farmCashFlowSettings)
		.where(eq(farmCashFlowSettings.farmId, farmId));
	return row ?? defaultCashFlowSettings;
}

/** Saves the farm's cash-flow settings (one row a farm) with its audit entry, in one transaction. */
export async function saveCashFlowSettings(
	db: Db | Tx,
	farmId: string,
	userId: string,
	settings: CashFlowSettings
) {
	await db.transaction(async (tx) => {
		const values = { ...settings, updatedById: userId };
		await tx
			.insert(farmCashFlowSettings)
			.values({ farmId, ...values })
			.onConflictDoUpdate({ target: farmCashFlowSettings.farmId, set: values });
		await insertAuditEntry(tx, { farmId, userId, action: 'cash-flow-settings.updated' });
	});
}
