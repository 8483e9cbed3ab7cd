/**
 * Optical density that eyewear (or any attenuator) must provide: OD = log₁₀(exposure/limit) when the
 * ratio exceeds 1, else 0 (common practice: OD = log₁₀(H/MPE)), rounded up to a tenth and to a whole
 * number (common practice: eyewear is specified by the next whole OD). Rounding is always up: a
 * required OD is compared with what eyewear provides, so it may only err on the safe side. Noise
 * below 1e-9 is settled first, so that an exact power of ten (ratio 1000 → OD 3) needs no extra OD.
 */
import type { OpticalDensity } from '$lib/assessmentResult';

const SETTLE = 1e9;

export function requiredOpticalDensity(ratio: number): OpticalDensity {
	if (!(ratio > 1)) return { value: 0, roundedUpTenth: 0, roundedUpWhole: 0 };
	const value = Math.log10(ratio);
	const settled = Math.round(value * SETTLE) / SETTLE;
	return { value, roundedUpTenth: Math.ceil(Math.round(settled * 10 * SETTLE) / SETTLE) / 10, roundedUpWhole: Math.ceil(settled) };
}
