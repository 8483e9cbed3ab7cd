// The beam and the exposure along a stored path, for the drawings (the exposure plot, the hazard
// zone) and the editor's power column: the engine evaluated at sampled positions with the same path
// and limits as the assessment. Pure: no database.
import type { AssessmentResult, ElementPowers, Profile, ProfileSample } from '$lib/assessmentResult';
import type { BeamSample } from '$lib/hazardZone';
import type { BeamPath, LimitSI } from '$lib/schemas/assessment';
import { evaluate } from '$lib/server/hazard';
import { variantsOf } from '$lib/server/hazard/tuning';
import { validate } from '$lib/server/hazard/validate';
import { walkPath } from '$lib/server/hazard/walk';

const PROFILE_SAMPLES = 80;
const ENVELOPE_SAMPLES = 120;

/** The duration a sampled point is assessed for: the path's hazard-distance duration, else its first eye point's (none: the checks say what is missing). */
export function samplingDuration(path: BeamPath): string | null {
	return path.nohdExposureDuration ?? path.points.find((p) => p.tissue === 'eye')?.exposureDuration ?? null;
}

const evenly = (length: number, samples: number) => Array.from({ length: samples + 1 }, (_, i) => (length * i) / samples);

/** The path with its points replaced by eye-level intrabeam points at these positions, evaluated without the breakdown. */
function sampleAlong(path: BeamPath, limits: LimitSI[], positions: number[]) {
	const exposureDuration = samplingDuration(path);
	const points = positions.map((z, i) => ({ id: `s${i}`, label: '', position: String(z), tissue: 'eye' as const, kind: 'intrabeam' as const, exposureDuration, reflectance: null, viewingAngle: null, viewingDistance: null }));
	return evaluate({ ...path, points }, limits, { breakdown: false });
}

/** The beam's diameter along the path for the hazard zone drawing: evenly spaced and at every element, the widest line at each. */
export function beamEnvelope(path: BeamPath, limits: LimitSI[], length: number, elementPositions: number[] = []): BeamSample[] | null {
	if (!(length > 0)) return null;
	const positions = [...new Set([...evenly(length, ENVELOPE_SAMPLES), ...elementPositions.filter((z) => z >= 0 && z <= length)])].sort((a, b) => a - b);
	const outcome = sampleAlong(path, limits, positions);
	if (!outcome.ok) return null;
	return outcome.result.points.map((p, i) => ({ position: positions[i], diameter: Math.max(0, ...p.lines.map((l) => l.beamDiameter).filter(Number.isFinite)) }));
}

/**
 * The power factor of every line after every element, from the engine's own walk (bands included).
 * A tunable line takes the largest factor over the wavelengths it is assessed at (never understated).
 */
export function elementPowers(path: BeamPath, limits: LimitSI[]): ElementPowers | null {
	const v = validate(path, limits);
	if (!v.ok) return null;
	const variants = variantsOf(v.path.lines, v.limits, v.path.elements);
	const walk = walkPath(variants, v.path.elements, v.path.length);
	const factorsOf = (transmission: number[]) =>
		v.path.lines.map((_, i) => Math.max(...transmission.filter((_, k) => variants[k].index === i)));
	let current = factorsOf(walk.origins[0].transmission);
	return v.path.elements.map((e) => {
		const origin = walk.origins.find((o) => o.afterElement === e.index);
		if (origin) current = factorsOf(origin.transmission);
		return { element: e.index, factors: current };
	});
}

export function exposureProfile(path: BeamPath, limits: LimitSI[], result: AssessmentResult): Profile | null {
	const length = result.pathLength;
	if (!(length > 0)) return null;
	const T = samplingDuration(path);
	const positions = evenly(length, PROFILE_SAMPLES);
	const outcome = sampleAlong(path, limits, positions);
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
	const ratios =
		path.lines.length > 1
			? {
					lines: path.lines.map((_, i) => ({ line: i, ratios: outcome.result.points.map((pt) => pt.lines.find((l) => l.line === i)?.worstRatio ?? null) })),
					sum: outcome.result.points.map((pt) => pt.worstRatio)
				}
			: null;
	return { check: anyLimit ? check : null, checkLabel: anyLimit ? (ranked[0]?.label ?? '') : 'No applicable limit: exposure only', unit, exposureDuration: T === null ? null : Number(T), samples, ratios };
}
