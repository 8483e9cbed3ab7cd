/**
 * The benchmark's synthetic campus register: seeded, in the product's one beam-path shape (every
 * field present, null when absent, as the mapper from rows gives it). A mix of continuous,
 * single-pulse and repetitive lines with a few elements each, four points and three limits per path;
 * a third of the paths carry two or three lines (a fundamental and its harmonics, emitted together),
 * some through a dichroic that passes each line its own share.
 * The limits are invented synthetic data shaped like real ones (k·tⁿ); their values are from no code.
 */
import type { BeamPath, ElementSI, LimitSI, PointSI } from '../src/lib/schemas/assessment';

export interface RegisterPath {
	path: BeamPath;
	limits: LimitSI[];
}

function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const WAVELENGTHS = ['405e-9', '532e-9', '800e-9', '1064e-9', '1550e-9', '10.6e-6'];
const DEFS = ['1/e', '1/e2', 'fwhm'] as const;

type LimitFields = Pick<LimitSI, 'id' | 'label' | 'tissue' | 'durationMin' | 'durationMax' | 'quantity' | 'k' | 'n' | 'limitingAperture' | 'pulseBasis'> & { version: number; pulseTrainExponent?: string };
const limit = (l: LimitFields): LimitSI => ({
	id: l.id,
	version: String(l.version),
	label: l.label,
	citation: 'synthetic benchmark data',
	tissue: l.tissue,
	wavelengthMin: '1.8e-7',
	wavelengthMax: '1e-3',
	durationMin: l.durationMin,
	durationMax: l.durationMax,
	quantity: l.quantity,
	k: l.k,
	n: l.n,
	limitingAperture: l.limitingAperture,
	pulseBasis: l.pulseBasis,
	pulseTrainExponent: l.pulseTrainExponent ?? null,
	noTrainCorrection: false
});

function limitsFor(wl: string, mode: string): LimitSI[] {
	const eyeCw = limit({ id: `eye-cw-${wl}`, version: 1, label: 'eye continuous', tissue: 'eye', durationMin: '1e-6', durationMax: '3e4', quantity: 'radiant_exposure', k: '18', n: '0.75', limitingAperture: '7e-3', pulseBasis: 'continuous' });
	const eyeSp = limit({ id: `eye-sp-${wl}`, version: 2, label: 'eye single pulse', tissue: 'eye', durationMin: '1e-13', durationMax: '1e-3', quantity: 'radiant_exposure', k: '0.05', n: '0', limitingAperture: '7e-3', pulseBasis: 'single_pulse', pulseTrainExponent: '-0.25' });
	const skin = limit({ id: `skin-${mode}`, version: 1, label: 'skin', tissue: 'skin', durationMin: '1e-13', durationMax: '3e4', quantity: mode === 'continuous' ? 'irradiance' : 'radiant_exposure', k: mode === 'continuous' ? '2000' : '200', n: mode === 'continuous' ? '0' : '0.25', limitingAperture: '3.5e-3', pulseBasis: mode === 'continuous' ? 'continuous' : 'single_pulse' });
	const eyeCw2 = limit({ id: `eye-cw-irr-${wl}`, version: 1, label: 'eye continuous', tissue: 'eye', durationMin: '10', durationMax: '3e4', quantity: 'irradiance', k: '10', n: '0', limitingAperture: '1e-3', pulseBasis: 'continuous' });
	return mode === 'continuous' ? [eyeCw, eyeCw2, skin] : [eyeSp, eyeCw, skin];
}

const element = (kind: ElementSI['kind'], values: Partial<ElementSI>): ElementSI => ({
	kind,
	label: '',
	length: null,
	transmission: null,
	reflectance: null,
	magnification: null,
	focalLength: null,
	coreDiameter: null,
	numericalAperture: null,
	couplingTransmission: null,
	bands: null,
	...values
});

/** n paths drawn from the generator seeded with `seed` (the register: 20240611; the warm-up: 7). */
export function registerOf(n: number, seed: number): RegisterPath[] {
	const rnd = mulberry32(seed);
	const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
	/** A decimal string with 4 significant digits, log-uniform between lo and hi. */
	const logU = (lo: number, hi: number) => Math.exp(Math.log(lo) + rnd() * (Math.log(hi) - Math.log(lo))).toPrecision(4);
	const makePath = (i: number): RegisterPath => {
		const mode = pick(['continuous', 'continuous', 'single_pulse', 'repetitive', 'repetitive'] as const);
		const harmonics = i % 3 === 2 ? 1 + Math.floor(rnd() * 2) : 0;
		const wl = harmonics ? pick(['1064e-9', '800e-9', '1550e-9']) : pick(WAVELENGTHS);
		const beamDiameter = logU(0.5e-3, 10e-3);
		const beamDiameterDefinition = pick(DEFS);
		const divergence = rnd() < 0.05 ? '0' : logU(0.1e-3, 5e-3);
		const divergenceDefinition = pick(DEFS);
		const beamQuality = (1 + rnd()).toFixed(2);
		let power: string | null = null;
		let pulseEnergy: string | null = null;
		let pulseDuration: string | null = null;
		let repetitionRate: string | null = null;
		if (mode === 'continuous') power = logU(1e-3, 100);
		else {
			pulseEnergy = logU(1e-6, 1);
			pulseDuration = logU(30e-15, 1e-6);
			if (mode === 'repetitive') repetitionRate = pick(['10', '1000', '80e6'].filter((f) => Number(pulseDuration) * Number(f) < 0.5));
		}
		const elements: ElementSI[] = [];
		let length = 0;
		const nEl = 2 + Math.floor(rnd() * 4);
		for (let k = 0; k < nEl; k++) {
			const r = rnd();
			if (r < 0.35) {
				const L = Number(logU(0.1, 5));
				length += L;
				elements.push(element('propagate', { length: String(L) }));
			} else if (r < 0.5) elements.push(element('transmission', { transmission: rnd().toFixed(3), label: 'attenuator' }));
			else if (r < 0.65) elements.push(element('mirror', { reflectance: (0.9 + rnd() / 10).toFixed(3) }));
			else if (r < 0.75) elements.push(element('expander', { magnification: pick(['0.5', '2', '3', '5']) }));
			else if (r < 0.82) elements.push(element('lens', { focalLength: pick(['0.05', '0.1', '0.25', '0.5']) }));
			else {
				const L = Number(logU(0.2, 2));
				length += L;
				elements.push(element('enclosure', { length: String(L) }));
			}
		}
		if (harmonics && rnd() < 0.5) {
			// A dichroic: the fundamental passes, the first harmonic mostly reflected away.
			const h2 = Number(wl) / 2;
			elements.push(element('transmission', { label: 'dichroic', transmission: '0.95', bands: [{ wavelengthMin: String(h2 * 0.99), wavelengthMax: String(h2 * 1.01), transmission: '0.002' }] }));
		}
		elements.push(element('propagate', { length: '2' }));
		length += 2;
		const points: PointSI[] = [];
		for (let p = 0; p < 4; p++) {
			const z = (rnd() * length).toFixed(3);
			const diffuse = rnd() < 0.25;
			const tissue = rnd() < 0.8 ? 'eye' : 'skin';
			const exposureDuration = pick(['0.25', '10', '100', '30000']);
			const reflectance = diffuse ? rnd().toFixed(2) : null;
			const viewingAngle = diffuse ? (rnd() * 1.2).toFixed(3) : null;
			const viewingDistance = diffuse ? logU(0.2, 3) : null;
			points.push({ id: `p${p}`, label: `point ${p}`, position: z, tissue, exposureDuration, kind: diffuse ? 'diffuse' : 'intrabeam', reflectance, viewingAngle, viewingDistance });
		}
		return {
			path: {
				lines: [1, 2, 3].slice(0, 1 + harmonics).map((order, k) => {
					// Harmonic k: λ/order, a share of the fundamental's power or energy.
					const share = k === 0 ? 1 : [0.5, 0.2][k - 1];
					const scaled = (v: string | null) => (v === null ? null : (Number(v) * share).toPrecision(4));
					return { id: null, label: '', emissionGroup: harmonics ? 'harmonics' : '', mode, wavelength: (Number(wl) / order).toPrecision(6), wavelengthMax: null, power: scaled(power), pulseEnergy: scaled(pulseEnergy), pulseDuration, repetitionRate, beamProfile: 'gaussian' as const, beamDiameter, beamDiameterDefinition, divergence, divergenceDefinition, beamQuality, hotSpotFactor: null };
				}),
				elements,
				points,
				nohdExposureDuration: i % 2 ? '0.25' : '10'
			},
			limits: limitsFor(wl, mode)
		};
	};
	return Array.from({ length: n }, (_, i) => makePath(i));
}
