// Writing results for people: the numbers come from $lib/display (3 significant figures, rounded
// toward the safe side where compared); the words for checks, points and causes are here.
export { exposure, num, od, qty, ratio, withUnit } from '$lib/display';

export const tissueWords: Record<string, string> = { eye: 'eye', skin: 'skin' };
export const pointKindWords: Record<string, string> = { intrabeam: 'intrabeam', diffuse: 'diffuse reflection' };
export const checkWords: Record<string, string> = { single_pulse: 'single pulse', average_power: 'average power', pulse_train: 'pulse train', continuous: 'continuous' };
export const causeWords: Record<string, string> = { save: 'saved', reassess: 're-evaluated after a limit changed (or its line)', engine: 're-evaluated by a new engine version' };
export const distanceStatusWords: Record<string, string> = {
	finite: 'computed',
	partial: 'at least (a check has no limit)',
	unbounded: 'unbounded',
	incomplete: 'incomplete',
	no_applicable_limit: 'no applicable limit'
};
