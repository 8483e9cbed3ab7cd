// Exposure along the path for the plot: the engine evaluated at evenly spaced positions, with the
// same line, elements and limits as the assessment. Pure: no database.
import { assess, type AssessmentInput, type CheckKind } from '$lib/server/hazard';

export type ProfileSample = {
	position: number;
	/** Exposure of the plotted check, in its unit; null where it cannot be computed. */
	exposure: number | null;
	/** The most restrictive applicable limit of that check, same unit; null = no applicable limit. */
	limit: number | null;
	accessible: boolean;
};

export type Profile = {
	check: CheckKind | null;
	checkLabel: string;
	unit: string | null;
	exposureDuration: string | null;
	samples: ProfileSample[];
};

const SAMPLES = 80;

export function exposureProfile(input: AssessmentInput, pathLength: number, exposureDuration: string | null): Profile | null {
	if (!(pathLength > 0)) return null;
	const positions = Array.from({ length: SAMPLES + 1 }, (_, i) => (pathLength * i) / SAMPLES);
	const outcome = assess({
		...input,
		points: positions.map((p, i) => ({ id: `s${i}`, position: String(p), tissue: 'eye', kind: 'intrabeam', exposureDuration })),
		options: { breakdown: false }
	});
	if (!outcome.ok) return null;
	// Plot one check throughout: the one with the highest ratio at the aperture.
	const first = outcome.result.points[0];
	const ranked = [...first.checks].sort((a, b) => Number(b.ratio ?? -1) - Number(a.ratio ?? -1));
	const check = ranked[0]?.kind ?? null;
	let unit: string | null = null;
	const samples = outcome.result.points.map((pt, i) => {
		const c = pt.checks.find((x) => x.kind === check);
		const deciding = c?.comparisons.find((x) => x.deciding) ?? null;
		if (deciding) {
			unit = deciding.unit;
			return { position: positions[i], exposure: Number(deciding.exposure), limit: Number(deciding.limitValue), accessible: pt.accessible };
		}
		// No applicable limit: still show the exposure, without a limit line.
		const raw = pt.irradiance ?? pt.pulseRadiantExposure;
		unit ??= pt.irradiance ? 'W/m²' : 'J/m²';
		return { position: positions[i], exposure: raw === null ? null : Number(raw), limit: null, accessible: pt.accessible };
	});
	const anyLimit = samples.some((s) => s.limit !== null);
	return { check: anyLimit ? check : null, checkLabel: anyLimit ? (ranked[0]?.label ?? '') : 'No applicable limit: exposure only', unit, exposureDuration, samples };
}
