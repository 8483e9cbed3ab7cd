/**
 * assess(): the public entry. Validates, walks the path, evaluates every point, aggregates.
 *
 * Overall verdict: the worst verdict over the accessible points, with the precedence
 *     exceeds_limit > incomplete > no_applicable_limit > within_limit.
 * An assessment is never within limit while any accessible point is incomplete or has no applicable
 * limit, and never within limit without any accessible point. Points inside an enclosure are
 * computed and reported but take no part in the verdict, the worst point or the optical density.
 */
import type Decimal from 'decimal.js';
import { AssessmentDec, ELEMENTARY_CHARGE, ENGINE_VERSION, PLANCK_CONSTANT, RESULT_CAUTION, SPEED_OF_LIGHT, numbersOf, type DecimalClone } from './constants';
import { Working } from './breakdown';
import { compare } from './digits';
import { requiredOpticalDensity, writeOd } from './density';
import { hazardDistance } from './distances';
import { walkPath } from './elements';
import { evaluatePoint, VERDICT_RANK, type PointContext } from './exposure';
import { fmt, fmtOrNull, NonFiniteResultError } from './format';
import { LimitIndex, limitRef } from './limits';
import { joulesToElectronvolts, photonEnergy } from './photon';
import { validate, type NormInput, type NormLimit } from './validate';
import type { AssessmentInput, AssessmentOutcome, AssessmentResult, LensNohdResult, LineResult, PointResult, Verdict } from './types';

export function assess(input: AssessmentInput): AssessmentOutcome {
	return assessAtPrecision(input, AssessmentDec);
}

/**
 * assess() in the decimal clone D: AssessmentDec (25 digits) is what assess() uses; the 40-digit
 * reference clone `Dec` gives the run that the 25-digit results are checked against.
 */
export function assessAtPrecision(input: AssessmentInput, D: DecimalClone): AssessmentOutcome {
	try {
		const v = validate(input, D);
		if (!v.ok) return { ok: false, errors: v.errors.items };
		return { ok: true, result: compute(v.input) };
	} catch (err) {
		// Not expected for any input; reported as an error rather than thrown.
		const why = err instanceof NonFiniteResultError ? err.message : err instanceof Error ? err.message : String(err);
		return { ok: false, errors: [{ field: '', reason: `The assessment could not be computed (${why}). Check the inputs for extreme values.` }] };
	}
}

/** Photon energy, its reciprocal and its value in eV depend on the wavelength only. */
interface PhotonQuantities {
	ePh: Decimal;
	perPhoton: Decimal;
	eV: Decimal;
}
// Keyed by wavelength instance (wavelengths are read through the cache, so a register's few
// wavelengths share instances); bounded.
const photonMemo = new Map<Decimal, PhotonQuantities>();
function photonQuantities(wavelength: Decimal): PhotonQuantities {
	let q = photonMemo.get(wavelength);
	if (!q) {
		const ePh = photonEnergy(wavelength);
		q = { ePh, perPhoton: numbersOf(ePh).ONE.div(ePh), eV: joulesToElectronvolts(ePh) };
		if (photonMemo.size >= 256) photonMemo.clear();
		photonMemo.set(wavelength, q);
	}
	return q;
}

function compute(input: NormInput): AssessmentResult {
	const { line, limits } = input;
	const K = numbersOf(line.wavelength);
	const index = new LimitIndex(limits, line.wavelength);
	const w = new Working(input.breakdown);
	const used = new Set<NormLimit>();

	// Line quantities.
	const { ePh, perPhoton, eV } = photonQuantities(line.wavelength);
	if (w.enabled) w.add('photon-energy', 'Photon energy', 'E_ph = h·c / λ', [['h', PLANCK_CONSTANT, 'J·s'], ['c', SPEED_OF_LIGHT, 'm/s'], ['λ', line.wavelength, 'm']], ePh, 'J', 'Exact SI 2019 constants.');
	if (w.enabled) w.add('photon-energy-ev', 'Photon energy in electronvolts', 'E_ph[eV] = E_ph / e', [['E_ph', ePh, 'J'], ['e', ELEMENTARY_CHARGE, 'C']], eV, 'eV');
	if (w.enabled && line.beamDiameterDefinition !== '1/e') w.add('beam-diameter', 'Beam diameter at the aperture on the 1/e basis', line.beamDiameterDefinition === '1/e2' ? 'D₀ = D₀(1/e²) / √2' : 'D₀ = D₀(FWHM) / √(ln 2)', [[line.beamDiameterDefinition === '1/e2' ? 'D₀(1/e²)' : 'D₀(FWHM)', line.beamDiameterEntered, 'm']], line.d0, 'm', 'Exact for a Gaussian beam.');
	if (w.enabled && line.divergenceDefinition !== '1/e') w.add('divergence', 'Divergence on the 1/e basis', line.divergenceDefinition === '1/e2' ? 'φ = φ(1/e²) / √2' : 'φ = φ(FWHM) / √(ln 2)', [[line.divergenceDefinition === '1/e2' ? 'φ(1/e²)' : 'φ(FWHM)', line.divergenceEntered, 'rad']], line.divergence, 'rad', 'Exact for a Gaussian beam.');
	let photonFlux: Decimal | null = null;
	let peakPhotonFlux: Decimal | null = null;
	let photonsPerPulse: Decimal | null = null;
	if (w.enabled && line.mode === 'repetitive') w.add('average-power', 'Average power', 'P_avg = Q·f', [['Q', line.pulseEnergy!, 'J'], ['f', line.repetitionRate!, 'Hz']], line.averagePower!, 'W');
	if (w.enabled && line.peakPower) w.add('peak-power', 'Peak power', 'P_peak = Q / τ', [['Q', line.pulseEnergy!, 'J'], ['τ', line.pulseDuration!, 's']], line.peakPower, 'W');
	if (line.averagePower) {
		photonFlux = line.averagePower.times(perPhoton);
		if (w.enabled) w.add('photon-flux', 'Photon flux', 'Φ = P / E_ph', [['P', line.averagePower, 'W'], ['E_ph', ePh, 'J']], photonFlux, 's⁻¹');
	}
	if (line.pulseEnergy) {
		photonsPerPulse = line.pulseEnergy.times(perPhoton);
		peakPhotonFlux = line.peakPower!.times(perPhoton);
		if (w.enabled) w.add('photons-per-pulse', 'Photons per pulse', 'N_ph = Q / E_ph', [['Q', line.pulseEnergy, 'J'], ['E_ph', ePh, 'J']], photonsPerPulse, '');
	}

	// Path.
	const path = walkPath(line, input.elements);

	// Check plans (by exposure duration) and the limits evaluated for them are shared by the hazard
	// distances and the points of the assessment.
	const ctx: PointContext = { line, limits: index, photonEnergy: ePh, perPhoton, plans: new Map(), breakdown: input.breakdown, used, K, photonEnergyText: fmt(ePh) };

	// NOHD at the aperture.
	const nohd = hazardDistance(ctx, input.nohdExposureDuration, { waist: line.d0, waistSymbol: 'D₀', divergence: line.divergence, transmission: K.ONE }, w, 'nohd', 'at the aperture');

	// NOHD after each lens, from its focus.
	const lensNohd: LensNohdResult[] = path.lenses.map((lens) => {
		const out = hazardDistance(ctx, input.nohdExposureDuration, { waist: lens.focalSpot, waistSymbol: 'd₀', divergence: lens.divergenceAfter, transmission: lens.transmission }, w, `lens${lens.index}.nohd`, `after the lens (element ${lens.index})`);
		if (w.enabled) {
			if (w.enabled) w.add(`lens${lens.index}.focal-spot`, `Focal spot of the lens (element ${lens.index}), 1/e`, 'd₀ = 2·M²·λ·f / (π·D_lens)', [['M²', line.beamQuality, ''], ['λ', line.wavelength, 'm'], ['f', lens.focalLength, 'm'], ['D_lens', lens.lensDiameter, 'm']], lens.focalSpot, 'm', 'Gaussian 1/e² waist 4·M²·λ·f/(π·D_lens,1/e²) rewritten on the 1/e basis.');
			if (w.enabled) w.add(`lens${lens.index}.divergence`, `Divergence after the focus (element ${lens.index})`, 'φ = D_lens / f', [['D_lens', lens.lensDiameter, 'm'], ['f', lens.focalLength, 'm']], lens.divergenceAfter, 'rad');
		}
		const handbook = out.deciding && !out.deciding.unbounded ? lens.focalLength.div(lens.lensDiameter).times(out.deciding.criticalDiameter) : null;
		const n = out.result;
		return {
			exposureDuration: n.exposureDuration,
			checksWithoutLimit: n.checksWithoutLimit,
			candidates: n.candidates,
			status: n.status,
			unbounded: n.unbounded,
			distance: n.distance,
			linearFormDistance: n.linearFormDistance,
			decidingLimit: n.decidingLimit,
			decidingCheck: n.decidingCheck,
			reason: n.reason,
			elementIndex: lens.index,
			focusPosition: fmt(lens.focusPosition),
			focalSpotDiameter: fmt(lens.focalSpot),
			divergenceAfterFocus: fmt(lens.divergenceAfter),
			handbookFormDistance: handbook && out.deciding!.distance!.isZero() ? fmt(out.deciding!.distance!) : fmtOrNull(handbook)
		};
	});

	// Points.
	const points: PointResult[] = [];
	const ratios: (Decimal | null)[] = [];
	for (const p of input.points) {
		const ev = evaluatePoint(ctx, p, path);
		points.push(ev.result);
		ratios.push(ev.ratio);
	}

	// Aggregation over accessible points.
	let verdict: Verdict = 'within_limit';
	let worstIndex = -1;
	let worstRatio: Decimal | null = null;
	let anyAccessible = false;
	points.forEach((p, i) => {
		if (!p.accessible) return;
		anyAccessible = true;
		if (VERDICT_RANK[p.verdict] > VERDICT_RANK[verdict]) verdict = p.verdict;
		const r = ratios[i];
		// Ratios written alike tie (the first point is kept): arithmetic noise cannot choose.
		if (r && (!worstRatio || (p.worstRatio !== points[worstIndex].worstRatio && compare(r, worstRatio) > 0))) {
			worstRatio = r;
			worstIndex = i;
		}
	});
	if (!anyAccessible) verdict = 'incomplete';
	if (worstIndex < 0 && anyAccessible) worstIndex = points.findIndex((p) => p.accessible && p.verdict === verdict);
	const worst = worstIndex >= 0 ? points[worstIndex] : null;
	// The worst ratio is the worst point's own: so is its optical density (written alike).
	const pointOd = worstRatio && ratios[worstIndex] === worstRatio ? points[worstIndex].requiredOpticalDensity : null;
	const od = pointOd ? { ...pointOd } : worstRatio ? writeOd(requiredOpticalDensity(worstRatio)) : null;

	const lineResult: LineResult = {
		wavelength: fmt(line.wavelength),
		mode: line.mode,
		photonEnergy: ctx.photonEnergyText,
		photonEnergyEV: fmt(eV),
		averagePower: fmtOrNull(line.averagePower),
		peakPower: fmtOrNull(line.peakPower),
		pulseEnergy: fmtOrNull(line.pulseEnergy),
		pulseDuration: fmtOrNull(line.pulseDuration),
		repetitionRate: fmtOrNull(line.repetitionRate),
		photonFlux: fmtOrNull(photonFlux),
		peakPhotonFlux: fmtOrNull(peakPhotonFlux),
		photonsPerPulse: fmtOrNull(photonsPerPulse),
		beamDiameter: fmt(line.d0),
		divergence: fmt(line.divergence),
		beamQuality: fmt(line.beamQuality)
	};

	return {
		engineVersion: ENGINE_VERSION,
		verdict,
		reason: overallReason(verdict, anyAccessible, worst),
		worstPointId: worst ? worst.id : null,
		worstRatio: worst && worstRatio ? worst.worstRatio : null,
		requiredOpticalDensity: od,
		line: lineResult,
		pathLength: fmt(path.length),
		nohd: nohd.result,
		lensNohd,
		points,
		limitsUsed: limits.filter((l) => used.has(l)).map(limitRef),
		limitsConsidered: limits.map(limitRef),
		breakdown: w.steps,
		caution: RESULT_CAUTION
	};
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
