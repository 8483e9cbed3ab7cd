// The live assessment: the form is read a moment after the last keystroke, and the preview API is
// asked again; an answer to an older request is never shown over a newer one.
import { lineFromRow, type LineColumns, type PreviewRequest } from '$lib/schemas/assessment';
import { pathToSI, type FieldErrors, type PathForm } from '$lib/schemas/register';
import type { PreviewResponse } from '$lib/assessmentResult';

type BodyOutcome = { ok: true; body: PreviewRequest } | { ok: false; kind: 'unfinished'; errors: FieldErrors } | { ok: false; kind: 'line'; message: string };

/**
 * The form in the one SI shape (the same mapping a save uses), with the chosen line as stored: the
 * body of the preview request. The engine itself checks the values and names what is wrong.
 */
export function previewBody(form: PathForm, lines: LineColumns[]): BodyOutcome {
	const si = pathToSI(form);
	if (!si.ok) return { ok: false, kind: 'unfinished', errors: si.errors };
	const chosen = lines.filter((l) => form.lineIds.includes(l.id));
	if (chosen.length === 0) return { ok: false, kind: 'line', message: lines.length ? 'Choose the emission lines to see the assessment.' : 'This laser has no emission line yet: add one on the laser’s page.' };
	return { ok: true, body: { path: { lines: chosen.map(lineFromRow), ...si.value } } };
}

export type PreviewStatus = 'idle' | 'waiting' | 'updating' | 'ready' | 'unfinished' | 'refused' | 'failed';

const DEBOUNCE_MS = 300;

export class LivePreview {
	status = $state<PreviewStatus>('idle');
	/** The latest answer of the API; kept while a newer one is on its way or the form is unfinished. */
	response = $state.raw<PreviewResponse | null>(null);
	/** Whether `response` still matches the form. */
	current = $state(false);
	/** A sentence on why there is no fresh result. */
	message = $state<string | null>(null);
	/** Messages per form field ('elements.2.length'), from the form reading or from the API. */
	fieldMessages = $state.raw<Record<string, string>>({});
	/** Messages from the API for a refused request, per field key as the API sent them. */
	problems = $state.raw<{ key: string; messages: string[] }[]>([]);
	/** Counts the answers shown so far. */
	revision = $state(0);

	#timer: ReturnType<typeof setTimeout> | undefined;
	#controller: AbortController | null = null;
	#lastBody = '';
	#lines: () => LineColumns[];

	constructor(lines: () => LineColumns[]) {
		this.#lines = lines;
	}

	/** Called on every change of the form; the form is read after a pause. */
	schedule(form: PathForm) {
		clearTimeout(this.#timer);
		const snapshot = structuredClone(form);
		this.#timer = setTimeout(() => void this.run(snapshot), DEBOUNCE_MS);
		if (this.status === 'ready' || this.status === 'idle') this.status = 'waiting';
	}

	async run(form: PathForm) {
		const outcome = previewBody(form, this.#lines());
		if (!outcome.ok) {
			this.#abort();
			this.#lastBody = '';
			this.current = false;
			this.problems = [];
			if (outcome.kind === 'unfinished') {
				this.status = 'unfinished';
				this.fieldMessages = outcome.errors;
				this.message = 'Finish the highlighted values to see the assessment.';
			} else {
				this.status = 'refused';
				this.fieldMessages = {};
				this.message = outcome.message;
			}
			return;
		}
		const body = JSON.stringify(outcome.body);
		if (body === this.#lastBody && this.response && this.current) {
			this.status = 'ready';
			return;
		}
		this.#abort();
		const controller = new AbortController();
		this.#controller = controller;
		this.#lastBody = body;
		this.status = 'updating';
		try {
			const r = await fetch('/api/assessments/preview', {
				method: 'POST',
				headers: { 'content-type': 'application/json', accept: 'application/json' },
				body,
				signal: controller.signal
			});
			const answer = await r.json().catch(() => null);
			if (controller.signal.aborted) return;
			if (r.ok && answer) {
				this.response = answer as PreviewResponse;
				this.current = true;
				this.message = null;
				this.fieldMessages = {};
				this.problems = [];
				this.status = 'ready';
				this.revision += 1;
				return;
			}
			this.#lastBody = '';
			this.current = false;
			const fields = (answer?.fields ?? {}) as Record<string, string[]>;
			this.problems = Object.entries(fields).map(([key, messages]) => ({ key, messages }));
			this.fieldMessages = Object.fromEntries(Object.entries(fields).map(([key, messages]) => [key, messages.join(' ')]));
			this.message = answer?.message ?? `The assessment could not be computed (HTTP ${r.status}).`;
			this.status = r.status === 400 ? 'refused' : 'failed';
		} catch (e) {
			if (controller.signal.aborted) return;
			this.#lastBody = '';
			this.current = false;
			this.status = 'failed';
			this.message = 'The live assessment could not be reached; it will be tried again when you next change a value.';
			console.warn('preview failed', e);
		} finally {
			if (this.#controller === controller) this.#controller = null;
		}
	}

	#abort() {
		this.#controller?.abort();
		this.#controller = null;
	}

	destroy() {
		clearTimeout(this.#timer);
		this.#abort();
	}
}
