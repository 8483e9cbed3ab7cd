// The report's sentences and table cells, written once for the print page and the PDF, with the
// same rounding as the screens ($lib/display: exposures up, limits down, ratios never under-read).
import type { AssessmentResult, HazardDistance, LineAtPoint, PointResult, Step } from '$lib/assessmentResult';
import { exposure, num, od, qty, ratio, withUnit } from '$lib/display';
import { elementWords, modeWords, verdictWords } from '$lib/words';

export const reportCautions = [
	'Computed from the data entered in Beamwarden. It does not replace measurement; the laser safety officer and the applicable local code decide.',
	'The exposure limits are those the laser safety officer entered from the local code, in the versions named below; check them against the code in force before relying on this report.',
	'A missing limit or input is reported as such: it is never a sign of safety.'
];

export const verdictWord = (v: string) => verdictWords[v]?.word ?? v;

function origin(d: { afterElement: number | null; elementKind?: string | null }): string {
	if (d.afterElement === null) return 'the aperture';
	return `element ${d.afterElement + 1}${d.elementKind ? ` (${(elementWords[d.elementKind] ?? d.elementKind).toLowerCase()})` : ''}`;
}

/** A hazard distance in words, rounded up (it bounds a zone); the reason when there is none. */
export function distanceText(d: HazardDistance): string {
	if (d.status === 'unbounded') return `unbounded from ${origin(d)}: the beam does not spread`;
	if ((d.status !== 'finite' && d.status !== 'partial') || d.distance === null) return d.reason;
	const at = `${d.status === 'partial' ? 'at least ' : ''}${qty(d.distance, 'length', { toward: 'up' })} from ${origin(d)}`;
	return d.distanceFromFocus !== undefined && d.distanceFromFocus !== null && d.distance > 0 ? `${at} (${qty(d.distanceFromFocus, 'length', { toward: 'up' })} beyond the focus)` : at;
}

/** The headline figures, as label → value. */
export function headline(r: AssessmentResult): [string, string][] {
	const worst = r.points.find((p) => p.id === r.worstPointId);
	return [
		['Verdict', `${verdictWord(r.verdict)} (overall, for the accessible points)`],
		['Worst ratio (exposure ÷ limit)', r.worstRatio === null ? 'not computed' : `${ratio(r.worstRatio)}${worst ? ` at “${worst.label || worst.id}”` : ''}`],
		['Optical density needed', r.requiredOpticalDensity ? `OD ${od(r.requiredOpticalDensity.value)} (next whole OD ${r.requiredOpticalDensity.roundedUpWhole})` : 'not computed: no ratio to a limit could be formed'],
		...r.requiredOpticalDensities.map(
			(x) => [`  at ${qty(x.wavelengthMin, 'wavelength')}${x.wavelengthMax !== x.wavelengthMin ? `–${qty(x.wavelengthMax, 'wavelength')}` : ''}`, `OD ${od(x.od.value)} (next whole ${x.od.roundedUpWhole})`] as [string, string]
		),
		[`NOHD${r.nohd.exposureDuration !== null ? ` (exposure ${num(r.nohd.exposureDuration)} s)` : ''}`, distanceText(r.nohd)],
		['Path length', qty(r.pathLength, 'length')]
	];
}

/** One row per emission line: what it is and how the engine used it. */
export function lineRows(r: AssessmentResult): string[][] {
	return r.lines.map((l) => [
		l.label || `line ${l.index + 1}`,
		`${qty(l.wavelength, 'wavelength')}${l.wavelengthMax !== null ? `–${qty(l.wavelengthMax, 'wavelength')}` : ''}`,
		modeWords[l.mode] ?? l.mode,
		[l.averagePower !== null ? `${l.mode === 'continuous' ? 'P' : 'P avg'} ${qty(l.averagePower, 'power')}` : '', l.pulseEnergy !== null ? `Q ${withUnit(l.pulseEnergy, 'J')}` : '', l.pulseDuration !== null ? `τ ${withUnit(l.pulseDuration, 's')}` : '', l.repetitionRate !== null ? `f ${withUnit(l.repetitionRate, 'Hz')}` : '']
			.filter(Boolean)
			.join(', '),
		`${qty(l.beamDiameter, 'length')} ${l.profile === 'flat_top' ? 'full width' : '(1/e)'}, ${qty(l.divergence, 'angle')}${l.hotSpotFactor > 1 ? `, hot spot ×${num(l.hotSpotFactor)}` : ''}`
	]);
}
export const lineHead = ['Line', 'Wavelength', 'Emission', 'Output', 'Beam at the aperture'];

export const pointHead = ['Point', 'Distance', 'Access', 'Verdict', 'Ratio', 'OD'];
export function pointRow(p: PointResult): string[] {
	return [
		`${p.label || p.id} (${p.tissue}, ${p.kind === 'diffuse' ? 'diffuse reflection' : 'intrabeam'})`,
		qty(p.position, 'length'),
		p.accessible ? 'accessible' : 'enclosed',
		verdictWord(p.verdict),
		p.worstRatio === null ? '—' : ratio(p.worstRatio),
		p.requiredOpticalDensity ? `${od(p.requiredOpticalDensity.value)} (→ ${p.requiredOpticalDensity.roundedUpWhole})` : '—'
	];
}

function lineName(r: AssessmentResult, i: number): string {
	return r.lines.length > 1 ? `${r.lines[i].label || `line ${i + 1}`} (${qty(r.lines[i].wavelength, 'wavelength')}): ` : '';
}

/** Exposure against the deciding limit, one sentence per line at a point. */
export function exposureLine(r: AssessmentResult, l: LineAtPoint): string {
	const check = [...l.checks].sort((a, b) => (b.ratio ?? -1) - (a.ratio ?? -1))[0];
	const c = check?.comparisons.find((x) => x.deciding) ?? null;
	if (check && c && c.limitValue !== null) {
		const ex = exposure(c.exposure, c.unit, 'up');
		const lim = exposure(c.limitValue, c.unit, 'down');
		return `${lineName(r, l.line)}exposure vs limit (${check.label}): ${ex.si} vs ${lim.si}`;
	}
	const raw = l.irradiance ?? l.pulseRadiantExposure;
	return `${lineName(r, l.line)}exposure ${exposure(raw, l.irradiance !== null ? 'W/m²' : 'J/m²', 'up').si} vs no applicable limit`;
}

/** Each check at a point: verdict, ratio, the deciding limit with version and citation. */
export function checkLines(r: AssessmentResult, p: PointResult): { head: string; detail: string[] }[] {
	return p.lines.flatMap((l) =>
		l.checks.map((c) => {
			const dc = c.comparisons.find((x) => x.deciding) ?? null;
			const detail = [c.reason];
			if (dc) {
				detail.push(`Deciding limit: ${dc.limit.label} (version ${dc.limit.version}) — ${dc.limit.citation}`);
				detail.push(
					`${withUnit(dc.exposure, dc.unit, 3, 'up')} vs ${withUnit(dc.limitValue, dc.unit, 3, 'down')}${dc.pulseCount !== undefined ? ` · N = ${num(dc.pulseCount)}, factor ${num(dc.trainFactor)}` : ''}`
				);
			}
			for (const x of c.comparisons) if (x.reason) detail.push(x.reason);
			if (c.missing.length) detail.push(`Missing: ${c.missing.join(', ')}`);
			return { head: `${lineName(r, l.line)}${c.label}: ${verdictWord(c.verdict)}${c.ratio !== null ? `, ratio ${ratio(c.ratio)}` : ''}${c.duration !== null ? `, over ${num(c.duration)} s` : ''}`, detail };
		})
	);
}

/** Hazard distances of a point beyond the checks (diffuse radius, skin distance). */
export function pointDistances(p: PointResult): string[] {
	const out: string[] = [];
	const d = p.diffuseHazardDistance;
	if (d) out.push(`Diffuse-reflection hazard distance: ${d.distance !== null ? `${d.status === 'partial' ? 'at least ' : ''}${qty(d.distance, 'length', { toward: 'up' })} from the reflecting spot. ` : ''}${d.reason}`);
	if (p.skinHazardDistance) out.push(`Skin hazard distance: ${distanceText(p.skinHazardDistance)}. ${p.skinHazardDistance.reason}`);
	return out;
}

/** A working step as the screens write it: label, formula, inputs, result, note. */
export function stepText(s: Step): { label: string; formula: string; inputs: string; value: string; note: string } {
	return {
		label: s.label,
		formula: s.formula,
		inputs: s.inputs.map((i) => `${i.symbol} = ${withUnit(i.value, i.unit, 6)}`).join('   '),
		value: `→ ${num(s.value, 6)}${s.unit ? ` ${s.unit}` : ''}`,
		note: s.note ?? ''
	};
}

/** Warnings of the result and its points, once each. */
export function warningsOf(r: AssessmentResult): string[] {
	return [...new Set([...r.warnings, ...r.points.flatMap((p) => p.warnings)])];
}
