import type { PlanSummary } from '$lib/engine';
import type { FieldIssue } from '$lib/schemas/issues';
import type { PlanDraftInput } from '$lib/schemas/plans';

// Short enough that a changed cell shows new numbers well inside 150 ms, long enough that a burst of
// clicks (assigning a rotation to ten fields) sends one request (common practice, no published source).
const debounceMs = 40;

/**
 * The results of the draft being edited, fetched from the plans API: debounced, the last answer wins
 * (earlier requests are aborted), and the previous numbers stay until new ones arrive.
 */
export class LiveResults {
	summary = $state<PlanSummary | null>(null);
	issues = $state<FieldIssue[]>([]);
	message = $state('');
	loading = $state(false);
	/** Answers shown so far (the page prints it for tests and the bench to wait on). */
	answered = $state(0);
	#timer: ReturnType<typeof setTimeout> | undefined;
	#controller: AbortController | undefined;

	constructor(private readonly url: () => string) {}

	request(draft: PlanDraftInput) {
		clearTimeout(this.#timer);
		// An answer for an older draft must never land after this one was asked for.
		this.#controller?.abort();
		this.loading = true;
		const body = JSON.stringify(draft);
		this.#timer = setTimeout(() => this.#fetch(body), debounceMs);
	}

	async #fetch(body: string) {
		this.#controller?.abort();
		const controller = new AbortController();
		this.#controller = controller;
		try {
			const response = await fetch(this.url(), {
				method: 'POST',
				headers: { 'Content-Type': 'application/json' },
				body,
				signal: controller.signal
			});
			const answer = await response.json();
			if (controller.signal.aborted) return;
			if (response.ok) {
				this.summary = answer;
				this.issues = [];
				this.message = '';
			} else {
				this.issues = answer.issues ?? [];
				this.message = answer.message ?? 'The results could not be worked out.';
			}
			this.answered += 1;
		} catch (error) {
			if (controller.signal.aborted) return;
			this.message = 'The results could not be fetched: check the connection and try again.';
			console.error(error);
		} finally {
			if (this.#controller === controller) this.loading = false;
		}
	}

	stop() {
		clearTimeout(this.#timer);
		this.#controller?.abort();
	}
}
