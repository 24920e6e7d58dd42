/** What the optimiser answers: the CLI prints it, the API returns it, the optimiser page shows it. */

export type OptimiseStatus =
	/** The best answer there is (whole fields: within the options' `gapPercent` of the best bound). */
	| 'optimal'
	/** No plan keeps every limit: `conflicts` names the limits that cannot all hold. */
	| 'infeasible'
	/** Stopped at the time limit: whole fields give the best answer found and the gap to the bound. */
	| 'time-limit'
	/** The net return could grow without end (a limit left out that the farm needs). */
	| 'unbounded'
	/** The solver failed; `message` says how. */
	| 'error';

export interface ChosenRotation {
	rotationId: string;
	rotationName: string;
	startingPhase: number;
	acres: number;
}

export interface FieldChoice {
	fieldId: string;
	fieldName: string;
	acres: number;
	/** Largest first. More than one: the continuous answer splits the field. */
	rotations: ChosenRotation[];
	split: boolean;
}

export interface BindingLimit {
	/** The model row's name, as in the LP file: `family_labour_2027_10`, `nitrogen_2028`. */
	name: string;
	/** Plain words: "One more family hour in October 2027 is worth $41.20." */
	label: string;
	/** What one more unit of the limit is worth to the objective (dollars per unit). */
	marginalValueUsd: number;
	/** The unit one more of: 'hour', 'lb N', 'gallon', 'acre', 'AU-day'. */
	unit: string;
	/** The limit as applied. */
	limit: number;
}

export interface LimitConflict {
	name: string;
	label: string;
}

export interface OptimisedYear {
	year: number;
	/** The budgets' net return of the mix this year (every hour charged at the labour rate). */
	netReturnUsd: number;
	nitrogenPurchasedLb: number;
	dieselGallons: number;
	labourHours: number;
	familyLabourHoursByMonth: number[];
	hiredLabourHoursByMonth: number[];
	grazingAuDays: number;
	hayBales: number;
	/** Acres by crop id this year. */
	cropAcres: { cropId: string; cropName: string; acres: number }[];
}

export interface OptimiseResult {
	status: OptimiseStatus;
	message: string;
	wholeFields: boolean;
	/**
	 * What the optimiser maximised, constant term included: the budgets' net return over the plan's
	 * years, plus the hired wage's difference from the labour rate, less the weights. Solving the LP file
	 * gives this same value. null when there is no answer.
	 */
	objectiveUsd: number | null;
	/** The budgets' net return of the mix over the plan's years (as the engine evaluates a plan). */
	netReturnUsd: number | null;
	/** Whole fields: the best bound's objective and the gap to it in percent (0 when optimal). */
	bestBoundUsd: number | null;
	gapPercent: number | null;
	fields: FieldChoice[];
	years: OptimisedYear[];
	bindingLimits: BindingLimit[];
	conflicts: LimitConflict[];
	/** What the model takes for granted, in plain words (shown with the answer). */
	assumptions: string[];
	model: { rows: number; columns: number; integerColumns: number };
	solveMs: number;
}

/** One point of a trade-off curve. */
export interface TradeOffPoint {
	limit: number;
	result: OptimiseResult;
}

/** The lines `POST …/optimise/trade-off` streams, one JSON object per line. */
export type TradeOffLine =
	| { type: 'progress'; done: number; total: number }
	| { type: 'point'; index: number; point: TradeOffPoint }
	| { type: 'done'; current: { limit: number; netReturnUsd: number } }
	| { type: 'error'; message: string; issues?: { path: string; message: string }[] };
