// Cash rent as a field's land cost, and the family's hours as the farm's labour.
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { oneCornFieldInput } from './fixtures';

function parse(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

function issuePaths(input: unknown) {
	const result = parsePlanDocument(input);
	return result.ok ? [] : result.issues.map((issue) => [issue.path, issue.message]);
}

describe('a cash-rented field', () => {
	// Enterprise budgets carry cash rent as the land cost of a rented acre, a cost per acre beside the
	// operating costs (Iowa State Ag Decision Maker A1-20, "Estimated costs of crop production", land
	// charge line; from memory). The arithmetic checked: rent × acres, all of it a cost.
	it('costs its rent × acres a year, lowering net return by exactly that', () => {
		const owned = parse(oneCornFieldInput());
		const rentedInput = oneCornFieldInput();
		rentedInput.fields[0] = {
			...rentedInput.fields[0],
			tenure: 'cash-rented',
			cashRentUsdPerAcre: 245
		};
		const rented = parse(rentedInput);
		const acres = rented.fields[0].acres;
		const [ownedYear] = evaluatePlan(owned).fieldYears;
		const [rentedYear] = evaluatePlan(rented).fieldYears;
		expect(ownedYear.cashRentUsd).toBe(0);
		expect(rentedYear.cashRentUsd).toBeCloseTo(245 * acres, 9);
		expect(ownedYear.netReturnUsd - rentedYear.netReturnUsd).toBeCloseTo(245 * acres, 6);
		const [farmYear] = evaluatePlan(rented).farmYears;
		expect(farmYear.cashRentUsd).toBeCloseTo(245 * acres, 9);
	});

	it('shows in a partial budget as a cost line of its crop', () => {
		const input = oneCornFieldInput();
		input.fields[0] = { ...input.fields[0], tenure: 'cash-rented', cashRentUsdPerAcre: 200 };
		const before = parse(input);
		const after = parse({
			...input,
			fields: [{ ...input.fields[0], cashRentUsdPerAcre: 260 }]
		});
		const [year] = evaluatePlan(after, before).partialBudget!.years;
		// the same crop keeps its place: the rent rise is one net added cost
		const rent = year.lines.addedCosts.find((line) => line.category === 'cash-rent');
		expect(rent?.amountUsd).toBeCloseTo(60 * before.fields[0].acres, 6);
		expect(rent?.item).toMatch(/cash rent/);
	});

	it('refuses rent on owned land, and rent past its range, naming the field', () => {
		const input = oneCornFieldInput();
		input.fields[0] = { ...input.fields[0], cashRentUsdPerAcre: 150 };
		expect(issuePaths(input)).toEqual([
			[
				'fields.0.cashRentUsdPerAcre',
				'An owned field pays no cash rent: set the tenure to cash-rented or the rent to 0.'
			]
		]);
		input.fields[0] = { ...input.fields[0], tenure: 'cash-rented', cashRentUsdPerAcre: 25_000 };
		expect(issuePaths(input)[0]).toEqual([
			'fields.0.cashRentUsdPerAcre',
			'The cash rent must be at most $2,000 per acre a year.'
		]);
	});
});

describe('the people who work on the farm', () => {
	const operator = {
		id: 'op',
		name: 'Dale',
		role: 'operator' as const,
		hoursAvailableByMonth: Array(12).fill(150)
	};
	const partner = {
		id: 'pa',
		name: 'Jo',
		role: 'partner' as const,
		hoursAvailableByMonth: Array(12).fill(50)
	};

	it('takes the farm’s labour hours as the family’s hours summed, hired help aside', () => {
		const input = oneCornFieldInput();
		input.farm.labourHoursAvailableByMonth = Array(12).fill(200);
		const hired = {
			id: 'hand',
			name: 'Seasonal hand',
			role: 'hired' as const,
			hoursAvailableByMonth: Array(12).fill(80),
			wageUsdPerHour: 22
		};
		input.people = [operator, partner, hired];
		expect(parse(input).people).toHaveLength(3);
		input.farm.labourHoursAvailableByMonth = Array(12).fill(280);
		expect(issuePaths(input)).toEqual([
			[
				'farm.labourHoursAvailableByMonth',
				expect.stringContaining("the operator's, partners' and family's hours summed")
			]
		]);
	});

	it('asks hired help for a wage and nobody else', () => {
		const input = oneCornFieldInput();
		input.farm.labourHoursAvailableByMonth = Array(12).fill(150);
		input.people = [
			{ ...operator, wageUsdPerHour: 20 },
			{ id: 'hand', name: 'Sam', role: 'hired' as const, hoursAvailableByMonth: Array(12).fill(10) }
		];
		expect(issuePaths(input).map(([path]) => path)).toEqual([
			'people.0.wageUsdPerHour',
			'people.1.wageUsdPerHour'
		]);
	});
});
