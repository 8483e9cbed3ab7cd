/**
 * evaluate(): the one entry of the engine. Validates, walks the path, evaluates every point, every
 * stretch and every beam's hazard distance, and aggregates.
 *
 * Overall verdict: the worst verdict over the accessible points, with the precedence
 *     exceeds_limit > incomplete > no_applicable_limit > within_limit.
 * An assessment is never within limit while any accessible point is incomplete or has no applicable
 * limit, and never within limit without any accessible point. Points inside an enclosure are
 * computed and reported but take no part in the verdict, the worst point or the optical density.
 */
import type { AssessmentResult, HazardDistance, LineOpticalDensity, LineResult, Outcome, PointResult, StretchResult, Verdict } from '$lib/assessmentResult';
import type { BeamPath, LimitSI } from '$lib/schemas/assessment';
import { ELEMENTARY_CHARGE, ENGINE_VERSION, PLANCK_CONSTANT, RESULT_CAUTION, SPEED_OF_LIGHT } from './constants';
import { Plans } from './checks';
import { requiredOpticalDensity } from './density';
import { beamLimits, hazardDistance, stretchWorst } from './distances';
import { durationWarning, evaluatePoint, stepPrefix } from './exposure';
import { limitRef, worse, type Context } from './context';
import { variantsOf } from './tuning';
import { photonEnergy } from './photon';
import { validate, type NormLimit, type NormLine, type NormPath } from './validate';
import { walkPath, type Origin } from './walk';
import { Working } from './working';

export interface EvaluateOptions {
	/** Include the step-by-step working (default true). */
	breakdown?: boolean;
}

/** Assess a beam path against the limits. Never throws: bad input comes back as errors naming fields. */
export function evaluate(path: BeamPath | unknown, limits: LimitSI[] | unknown, options: EvaluateOptions = {}): Outcome {
	const v = validate(path, limits);
	if (!v.ok) return v;
	try {
		const result = compute(v.path, v.limits, options.breakdown !== false);
		if (!finite(result.worstRatio) || !finite(result.nohd.distance)) throw new Error('a non-finite value arose');
		return { ok: true, result };
	} catch (err) {
		// Not expected for any input the validation lets through; reported, never thrown.
		return { ok: false, errors: [{ field: '', reason: `The assessment could not be computed (${err instanceof Error ? err.message : String(err)}). Check the inputs for extreme values.` }] };
	}
}

const finite = (x: number | null) => x === null || Number.isFinite(x);

function compute(path: NormPath, limits: NormLimit[], breakdown: boolean): AssessmentResult {
	// A tunable line is assessed at every wavelength where something changes (tuning.ts).
	const variants = variantsOf(path.lines, limits, path.elements);
	const walk = walkPath(variants, path.elements, path.length);
	const ctx: Context = { path, lines: variants, limits, walk, plans: variants.map((l) => new Plans(l)), photonEnergy: variants.map((l) => photonEnergy(l.wavelength)), breakdown };
	const used = new Set<number>();
	const w = new Working(breakdown);

	const lines = path.lines.map((line, i) => lineResult(line, photonEnergy(line.wavelength), w, path.lines.length > 1 ? `line${i + 1}.` : ''));

	// Hazard distances: one per beam (the aperture's and each element's); the largest is the NOHD.
	const T = path.nohdExposureDuration;
	const beams = walk.origins.map((origin) => beamLimits(ctx, origin, 'eye', T));
	const distances: HazardDistance[] = [];
	let nohdIndex = 0;
	walk.origins.forEach((origin, i) => {
		for (const u of beams[i].used) used.add(u);
		const d = hazardDistance(ctx, origin, 'eye', T, null, '', beams[i]);
		distances.push(d);
		const best = distances[nohdIndex];
		if (i > 0 && best.status !== 'unbounded' && (d.status === 'unbounded' || (d.distance ?? -1) > (best.distance ?? -1))) nohdIndex = i;
	});
	// The deciding beam again, with its working.
	const nohd = breakdown ? hazardDistance(ctx, walk.origins[nohdIndex], 'eye', T, w, 'nohd', beams[nohdIndex]) : distances[nohdIndex];
	if (breakdown) for (const o of walk.origins) if (o.lens) lensSteps(w, o, variants);

	// Points.
	const points: PointResult[] = [];
	const ratios: (number | null)[] = [];
	for (const p of path.points) {
		const ev = evaluatePoint(ctx, p);
		points.push(ev.result);
		ratios.push(ev.ratio);
		for (const u of ev.used) used.add(u);
	}

	// Open stretches: the worst eye exposure anywhere on them, at the hazard-distance duration.
	const stretches: StretchResult[] = [];
	for (const s of walk.stretches) {
		const afterElement = walk.origins[s.origin].afterElement;
		if (s.enclosedBy !== null) {
			stretches.push({ index: s.index, from: s.from, to: s.to, afterElement, enclosedBy: s.enclosedBy, beam: s.origin, worstRatio: null, worstAt: null, verdict: null, reason: `Inside the enclosure (element ${s.enclosedBy + 1}): not accessible.` });
			continue;
		}
		const worst = stretchWorst(walk.origins[s.origin], beams[s.origin], s.from, s.to);
		stretches.push({ index: s.index, from: s.from, to: s.to, afterElement, enclosedBy: null, beam: s.origin, worstRatio: worst.ratio, worstAt: worst.at, verdict: worst.verdict, reason: STRETCH_REASON[worst.verdict] });
	}

	// Aggregation over accessible points.
	let verdict: Verdict = 'within_limit';
	let worstIndex = -1;
	let anyAccessible = false;
	points.forEach((p, i) => {
		if (!p.accessible) return;
		anyAccessible = true;
		verdict = worse(verdict, p.verdict);
		const r = ratios[i];
		if (r !== null && (worstIndex < 0 || ratios[worstIndex] === null || r > ratios[worstIndex]!)) worstIndex = i;
	});
	if (!anyAccessible) verdict = 'incomplete';
	if (worstIndex < 0 && anyAccessible) worstIndex = points.findIndex((p) => p.accessible && p.verdict === verdict);
	const worst = worstIndex >= 0 ? points[worstIndex] : null;
	const worstRatio = worst ? worst.worstRatio : null;

	// Per line, the OD eyewear needs at it: the largest over the accessible points.
	const requiredOpticalDensities: LineOpticalDensity[] = [];
	path.lines.forEach((_, li) => {
		let need: LineOpticalDensity | null = null;
		for (const p of points) {
			if (!p.accessible) continue;
			const own = p.requiredOpticalDensities.find((o) => o.line === li);
			if (own && (!need || own.od.value > need.od.value)) need = { ...own, pointId: p.id };
		}
		if (need) requiredOpticalDensities.push(need);
	});

	const warnings: string[] = [];
	for (const line of path.lines) {
		const warning = durationWarning(path.nohdExposureDuration, line.wavelength, 'eye', 'The exposure duration for the hazard distances');
		if (warning && !warnings.includes(warning)) warnings.push(warning);
	}

	return {
		engineVersion: ENGINE_VERSION,
		verdict,
		reason: overallReason(verdict, anyAccessible, worst),
		worstPointId: worst ? worst.id : null,
		worstRatio,
		requiredOpticalDensity: worstRatio === null ? null : requiredOpticalDensity(worstRatio),
		requiredOpticalDensities,
		lines,
		pathLength: path.length,
		nohd,
		hazardDistances: distances,
		stretches,
		points,
		warnings,
		limitsUsed: limits.filter((l) => used.has(l.index)).map(limitRef),
		limitsConsidered: limits.map(limitRef),
		breakdown: w.steps,
		caution: RESULT_CAUTION
	};
}

const STRETCH_REASON: Record<Verdict, string> = {
	exceeds_limit: 'The worst eye exposure on this open stretch, where the beam is narrowest.',
	within_limit: 'The worst eye exposure on this open stretch, where the beam is narrowest.',
	incomplete: 'A check could not be made on this stretch (no exposure duration, or no pulse-train rule): the exposure may be higher than shown.',
	no_applicable_limit: 'No entered eye limit applies on this stretch. Not shown as safe.'
};

function lineResult(line: NormLine, ePh: number, w: Working, p: string): LineResult {
	const eV = ePh / ELEMENTARY_CHARGE;
	const perPhoton = 1 / ePh;
	if (w.enabled) {
		w.add(`${p}photon-energy`, 'Photon energy', 'E_ph = h·c / λ', [['h', PLANCK_CONSTANT, 'J·s'], ['c', SPEED_OF_LIGHT, 'm/s'], ['λ', line.wavelength, 'm']], ePh, 'J', 'Exact SI 2019 constants.');
		w.add(`${p}photon-energy-ev`, 'Photon energy in electronvolts', 'E_ph[eV] = E_ph / e', [['E_ph', ePh, 'J'], ['e', ELEMENTARY_CHARGE, 'C']], eV, 'eV');
		if (line.profile === 'gaussian' && line.beamDiameterDefinition !== '1/e')
			w.add(`${p}beam-diameter`, 'Beam diameter at the aperture on the 1/e basis', line.beamDiameterDefinition === '1/e2' ? 'D₀ = D₀(1/e²) / √2' : 'D₀ = D₀(FWHM) / √(ln 2)', [[line.beamDiameterDefinition === '1/e2' ? 'D₀(1/e²)' : 'D₀(FWHM)', line.beamDiameterEntered, 'm']], line.d0, 'm', 'Exact for a Gaussian beam.');
		if (line.profile === 'gaussian' && line.divergenceDefinition !== '1/e')
			w.add(`${p}divergence`, 'Divergence on the 1/e basis', line.divergenceDefinition === '1/e2' ? 'φ = φ(1/e²) / √2' : 'φ = φ(FWHM) / √(ln 2)', [[line.divergenceDefinition === '1/e2' ? 'φ(1/e²)' : 'φ(FWHM)', line.divergenceEntered, 'rad']], line.divergence, 'rad', 'Exact for a Gaussian beam.');
		if (line.profile === 'flat_top') w.add(`${p}flat-top`, 'Flat-top beam: the full width is the averaging diameter', 'D₀ = W', [['W', line.beamDiameterEntered, 'm']], line.d0, 'm', 'Even irradiance P/(π·W²/4) across the full width W.');
		if (line.mode === 'repetitive') w.add(`${p}average-power`, 'Average power', 'P_avg = Q·f', [['Q', line.pulseEnergy!, 'J'], ['f', line.repetitionRate!, 'Hz']], line.averagePower!, 'W');
		if (line.peakPower !== null) w.add(`${p}peak-power`, 'Peak power', 'P_peak = Q / τ', [['Q', line.pulseEnergy!, 'J'], ['τ', line.pulseDuration!, 's']], line.peakPower, 'W');
		if (line.averagePower !== null) w.add(`${p}photon-flux`, 'Photon flux', 'Φ = P / E_ph', [['P', line.averagePower, 'W'], ['E_ph', ePh, 'J']], line.averagePower * perPhoton, 's⁻¹');
		if (line.pulseEnergy !== null) w.add(`${p}photons-per-pulse`, 'Photons per pulse', 'N_ph = Q / E_ph', [['Q', line.pulseEnergy, 'J'], ['E_ph', ePh, 'J']], line.pulseEnergy * perPhoton, '');
	}
	return {
		index: line.index,
		label: line.label,
		emissionGroup: line.emissionGroup,
		wavelength: line.wavelength,
		wavelengthMax: line.wavelengthMax,
		mode: line.mode,
		photonEnergy: ePh,
		photonEnergyEV: eV,
		averagePower: line.averagePower,
		peakPower: line.peakPower,
		pulseEnergy: line.pulseEnergy,
		pulseDuration: line.pulseDuration,
		repetitionRate: line.repetitionRate,
		photonFlux: line.averagePower === null ? null : line.averagePower * perPhoton,
		peakPhotonFlux: line.peakPower === null ? null : line.peakPower * perPhoton,
		photonsPerPulse: line.pulseEnergy === null ? null : line.pulseEnergy * perPhoton,
		profile: line.profile,
		beamDiameter: line.d0,
		divergence: line.divergence,
		beamQuality: line.beamQuality,
		hotSpotFactor: line.hotSpot
	};
}

function lensSteps(w: Working, o: Origin, lines: NormLine[]): void {
	const lens = o.lens!;
	const e = o.afterElement! + 1;
	lines.forEach((line, i) => {
		const p = lines.length > 1 ? `${stepPrefix(line)}.` : '';
		w.add(`${p}lens${e}.focal-spot`, `Focal spot of the lens (element ${e}), 1/e`, 'd₀ = 2·M²·λ·f / (π·D_lens)', [['M²', line.beamQuality, ''], ['λ', line.wavelength, 'm'], ['f', lens.focalLength, 'm'], ['D_lens', lens.lensDiameters[i], 'm']], lens.focalSpots[i], 'm', 'Gaussian 1/e² waist 4·M²·λ·f/(π·D_lens,1/e²) rewritten on the 1/e basis.');
		w.add(`${p}lens${e}.divergence`, `Divergence after the focus (element ${e})`, 'φ = 2·atan(D_lens / (2f))', [['D_lens', lens.lensDiameters[i], 'm'], ['f', lens.focalLength, 'm']], lens.divergences[i], 'rad', 'The full angle of the cone that converges on the focus.');
	});
}

function overallReason(verdict: Verdict, anyAccessible: boolean, worst: PointResult | null): string {
	if (!anyAccessible) return 'No accessible point of concern: mark where a person could be exposed. Not shown as safe.';
	switch (verdict) {
		case 'exceeds_limit':
			return `At least one accessible point exceeds a limit; the worst is “${worst?.label}”.`;
		case 'incomplete':
			return 'At least one accessible point lacks input needed for a required check.';
		case 'no_applicable_limit':
			return 'At least one accessible point has a required check with no applicable limit. Not shown as safe.';
		case 'within_limit':
			return 'Every accessible point is within its most restrictive applicable limits.';
	}
}
