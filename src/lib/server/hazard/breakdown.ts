/**
 * The working: an ordered list of steps, each with its formula, the values that went in and the
 * value that came out, so that an officer (or a test) can recompute every number from the list.
 */
import type Decimal from 'decimal.js';
import { fmt } from './format';
import type { BreakdownInput, BreakdownStep } from './types';

export type StepInput = readonly [symbol: string, value: Decimal, unit: string];

export class Working {
	readonly steps: BreakdownStep[] = [];
	constructor(readonly enabled: boolean) {}

	add(id: string, label: string, formula: string, inputs: readonly StepInput[], value: Decimal, unit: string, note?: string): void {
		if (!this.enabled) return;
		const list: BreakdownInput[] = new Array(inputs.length);
		for (let i = 0; i < inputs.length; i++) {
			const [symbol, v, u] = inputs[i];
			list[i] = { symbol, value: fmt(v, id), unit: u };
		}
		const step: BreakdownStep = { id, label, formula, inputs: list, value: fmt(value, id), unit };
		if (note) step.note = note;
		this.steps.push(step);
	}
}
