/**
 * Typed input errors. The engine never throws for bad input: it collects every problem it finds
 * and returns them, each naming the field by a dotted path ('line.power', 'elements.2.transmission').
 */

export interface HazardInputError {
	/** Dotted path of the offending field, e.g. 'points.0.exposureDuration'. */
	field: string;
	/** A sentence a person can act on. */
	reason: string;
}

export class ErrorList {
	readonly items: HazardInputError[] = [];

	add(field: string, reason: string): void {
		this.items.push({ field, reason });
	}

	get empty(): boolean {
		return this.items.length === 0;
	}
}
