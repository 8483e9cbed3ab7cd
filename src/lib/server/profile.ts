// Exposure along the path for the plot: the engine evaluated at evenly spaced positions, with the
// same path and limits as the assessment (eye, intrabeam, at the hazard-distance duration, or at the
// first eye point's duration when that is not given). Pure: no database.
import type { AssessmentResult, Profile, ProfileSample } from '$lib/assessmentResult';
import type { BeamPath, LimitSI } from '$lib/schemas/assessment';
import { evaluate } from '$lib/server/hazard';

const SAMPLES = 80;

export function exposureProfile(path: BeamPath, limits: LimitSI[], result: AssessmentResult): Profile | null {
	const length = result.pathLength;
	if (!(length > 0)) return null;
	const T = path.nohdExposureDuration ?? path.points.find((p) => p.tissue === 'eye')?.exposureDuration ?? null;
	const positions = Array.from({ length: SAMPLES + 1 }, (_, i) => (length * i) / SAMPLES);
	const outcome = evaluate(
		{
			...path,
			points: positions.map((z, i) => ({ id: `s${i}`, label: '', position: String(z), tissue: 'eye' as const, kind: 'intrabeam' as const, exposureDuration: T, reflectance: null, viewingAngle: null, viewingDistance: null }))
		},
		limits,
		{ breakdown: false }
	);
	if (!outcome.ok) return null;
	// Plot one check throughout: the one with the highest ratio at the aperture.
	const first = outcome.result.points[0].lines[0];
	const ranked = [...first.checks].sort((a, b) => (b.ratio ?? -1) - (a.ratio ?? -1));
	const check = ranked[0]?.kind ?? null;
	let unit: string | null = null;
	const samples = outcome.result.points.map((pt, i) => {
		const line = pt.lines[0];
		const c = line.checks.find((x) => x.kind === check);
		const deciding = c?.comparisons.find((x) => x.deciding) ?? null;
		if (deciding && deciding.limitValue !== null) {
			unit = deciding.unit;
			return { position: positions[i], exposure: deciding.exposure, limit: deciding.limitValue, accessible: pt.accessible };
		}
		// No applicable limit: still show the exposure, without a limit line.
		const raw = line.irradiance ?? line.pulseRadiantExposure;
		unit ??= line.irradiance !== null ? 'W/m²' : 'J/m²';
		return { position: positions[i], exposure: raw, limit: null, accessible: pt.accessible };
	});
	const anyLimit = samples.some((s) => s.limit !== null);
	return { check: anyLimit ? check : null, checkLabel: anyLimit ? (ranked[0]?.label ?? '') : 'No applicable limit: exposure only', unit, exposureDuration: T === null ? null : Number(T), samples };
}
