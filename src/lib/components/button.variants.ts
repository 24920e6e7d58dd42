/** The app's button looks, in one place. */
export const buttonClass = {
	primary:
		'inline-flex min-h-11 items-center justify-center rounded bg-clover-600 px-4 py-2 font-semibold text-white hover:bg-clover-700 focus:ring-2 focus:ring-clover-300 focus:outline-none disabled:cursor-not-allowed disabled:opacity-50',
	secondary:
		'inline-flex min-h-11 items-center justify-center rounded border border-loam-300 bg-white px-4 py-2 font-semibold text-loam-800 hover:bg-loam-50 disabled:cursor-not-allowed disabled:opacity-50',
	/** Red only for what cannot be undone. */
	danger:
		'inline-flex min-h-11 items-center justify-center rounded bg-loss-600 px-4 py-2 font-semibold text-white hover:bg-loss-700 focus:ring-2 focus:ring-loss-100 focus:outline-none'
} as const;
