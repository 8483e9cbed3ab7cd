/**
 * The working: an ordered list of steps, each with its formula, the values that went in and the
 * value that came out, so that an officer (or a test) can recompute every number from the list.
 * When the caller asks for no breakdown, nothing is recorded (the preview's plot, the benchmark).
 */
import type { Step, StepInput } from '$lib/assessmentResult';

export type In = readonly [symbol: string, value: number, unit: string];

/** One input of a step. */
export const input = (symbol: string, value: number, unit: string): StepInput => ({ symbol, value, unit });

export class Working {
	readonly steps: Step[] = [];
	constructor(readonly enabled: boolean) {}

	add(id: string, label: string, formula: string, inputs: readonly In[], value: number, unit: string, note?: string): void {
		if (!this.enabled) return;
		const list: StepInput[] = new Array(inputs.length);
		for (let i = 0; i < inputs.length; i++) list[i] = input(inputs[i][0], inputs[i][1], inputs[i][2]);
		this.steps.push(note ? { id, label, formula, inputs: list, value, unit, note } : { id, label, formula, inputs: list, value, unit });
	}

	/** A step formed once and shared (a limit's value is the same at every point of an assessment). */
	push(step: Step): void {
		if (this.enabled) this.steps.push(step);
	}
}
