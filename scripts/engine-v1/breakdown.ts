/**
 * The working: an ordered list of steps, each with its formula, the values that went in and the
 * value that came out, so that an officer (or a test) can recompute every number from the list.
 */
import type Decimal from 'decimal.js';
import { fmt } from './format';
import type { BreakdownInput, BreakdownStep } from './types';

/** A value in a step: a decimal, or its text when the caller has already written it (see fmt). */
export type StepValue = Decimal | string;
export type StepInput = readonly [symbol: string, value: StepValue, unit: string];

export class Working {
	readonly steps: BreakdownStep[] = [];
	constructor(readonly enabled: boolean) {}

	add(id: string, label: string, formula: string, inputs: readonly StepInput[], value: StepValue, unit: string, note?: string): void {
		if (!this.enabled) return;
		const list: BreakdownInput[] = new Array(inputs.length);
		for (let i = 0; i < inputs.length; i++) {
			const input = inputs[i];
			const v = input[1];
			list[i] = { symbol: input[0], value: typeof v === 'string' ? v : fmt(v, id), unit: input[2] };
		}
		const step: BreakdownStep = { id, label, formula, inputs: list, value: typeof value === 'string' ? value : fmt(value, id), unit };
		if (note) step.note = note;
		this.steps.push(step);
	}
}
