import { replaceState } from '$app/navigation';
import { page } from '$app/state';

/** A queued job as `GET /api/v1/jobs/[jobId]` answers it. */
export interface JobAnswer<Result> {
	id: string;
	state: 'queued' | 'running' | 'retrying' | 'completed' | 'failed' | 'cancelled';
	progress: { done: number; total: number | null; percent: number };
	attempts: number;
	result: Result | null;
	error: string | null;
}

const unfinished = new Set<JobAnswer<unknown>['state']>(['queued', 'running', 'retrying']);

/** Whether a job still has work to do (or has not been read yet). */
export const isUnfinished = (job: JobAnswer<unknown> | null) =>
	job === null || unfinished.has(job.state);

interface Options<Result> {
	/** The address's query parameter that keeps the job's id, so a reloaded page picks the job up. */
	param: string;
	/** Each answer read, the last one when the job has ended. */
	onanswer: (job: JobAnswer<Result>) => void;
	/** The job is not found (pg-boss deletes jobs a week after they end). */
	onmissing: () => void;
}

/**
 * Follows a queued job from the page: reads it every half second until it ends, through dropped
 * connections. Call `resume` once the page is mounted and `stop` when it goes.
 */
export function followJob<Result>({ param, onanswer, onmissing }: Options<Result>) {
	let id = $state<string | null>(page.url.searchParams.get(param));
	let timer: ReturnType<typeof setTimeout> | undefined;

	async function poll() {
		const polled = id;
		if (!polled) return;
		let job: JobAnswer<Result> | null = null;
		try {
			const response = await fetch(`/api/v1/jobs/${polled}`);
			if (polled !== id) return; // another job was started meanwhile
			if (response.status === 404) {
				id = null;
				onmissing();
				return;
			}
			if (response.ok) {
				job = await response.json();
				onanswer(job!);
			}
		} catch {
			// A dropped connection in a pickup cab: try again on the next tick.
		}
		if (polled === id && isUnfinished(job)) timer = setTimeout(poll, 500);
	}

	return {
		/** The job followed, or null. */
		get id() {
			return id;
		},
		/** Follows a job just started, keeping its id in the address. */
		follow(jobId: string) {
			id = jobId;
			// A copy to hand to replaceState once, never read again: nothing to react to.
			// eslint-disable-next-line svelte/prefer-svelte-reactivity
			const url = new URL(page.url);
			url.searchParams.set(param, jobId);
			replaceState(url, page.state);
			clearTimeout(timer);
			void poll();
		},
		/** Follows the job named in the address, if any; true when there is one. */
		resume() {
			if (id) void poll();
			return id !== null;
		},
		stop() {
			clearTimeout(timer);
		}
	};
}
