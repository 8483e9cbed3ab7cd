// A line form checked the way every save checks it: its values in SI, then the hazard engine's own
// rules (one source of truth), so a line the engine cannot assess is never saved, by a form or an import.
import { lineToSI, type LineValues } from '$lib/schemas/register';
import { lineProblems } from '$lib/server/hazard';

/** Errors are keyed like the form (`prefix` + field). */
export function checkedLine(form: Parameters<typeof lineToSI>[0], prefix = ''): { ok: true; value: LineValues } | { ok: false; errors: Record<string, string> } {
	const line = lineToSI(form, prefix);
	if (!line.ok) return line;
	const problems = lineProblems(line.value);
	if (problems.length === 0) return line;
	const errors: Record<string, string> = {};
	for (const p of problems) errors[prefix + (p.field || 'wavelength')] ??= p.reason;
	return { ok: false, errors };
}
