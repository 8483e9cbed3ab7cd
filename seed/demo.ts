// The invented demo scenario: Northgate Photonics Centre. Every name and figure here is made up.
import type { Role } from '../src/lib/roles';

export const demoLabs = [
	{ code: 'UFL', name: 'Ultrafast Optics Laboratory', building: 'Meridian Building, room M2.14' },
	{ code: 'SPX', name: 'Raman and Fluorescence Spectroscopy', building: 'Meridian Building, room M1.07' },
	{ code: 'HEL', name: 'High-Energy Pulse Hall', building: 'Kestrel Annexe, hall K0.02' },
	{ code: 'MPC', name: 'Materials Processing Cells', building: 'Kestrel Annexe, bay K0.11' }
] as const;

export type DemoUser = { email: string; name: string; role: Role; password: string; labs: string[] };

/** Demo sign-ins for local use only; README lists them. */
export const demoUsers: DemoUser[] = [
	{ email: 'priya.raman@northgate.example', name: 'Priya Raman', role: 'researcher', password: 'violet-ferry-lantern-42', labs: ['UFL', 'SPX'] },
	{ email: 'tomas.weir@northgate.example', name: 'Tomas Weir', role: 'researcher', password: 'copper-meadow-signal-17', labs: ['HEL', 'MPC'] },
	{ email: 'helen.achter@northgate.example', name: 'Helen Achter', role: 'officer', password: 'quiet-harbour-prism-63', labs: [] },
	{ email: 'ines.varga@northgate.example', name: 'Ines Varga', role: 'officer', password: 'lattice-morning-ember-35', labs: [] },
	{ email: 'marcus.oyel@northgate.example', name: 'Marcus Oyel', role: 'manager', password: 'amber-circuit-willow-28', labs: [] },
	{ email: 'sam.lind@northgate.example', name: 'Sam Lind', role: 'admin', password: 'granite-orbit-pepper-91', labs: [] }
];

import type { LimitForm } from '../src/lib/schemas/limits';
import { blankElement, type NewLaserForm, type PathForm } from '../src/lib/schemas/register';

const src =
	'Demonstration value recalled from memory of the ICNIRP 2013 guidelines on limits of exposure to laser radiation (Health Physics 105(3):271–295) and IEC 60825-1:2014 Annex A; not checked against the text. Never use it as the local code: replace it with the local code’s value.';

type DemoLimit = Omit<LimitForm, 'version' | 'validFrom' | 'validUntil' | 'demonstration' | 'noTrainCorrection'>;

/** A row with the factors left out unless given. */
const limit = (l: Pick<DemoLimit, 'label' | 'tissue' | 'wavelengthMin' | 'wavelengthMax' | 'durationMin' | 'durationMax' | 'quantity' | 'k' | 'limitingAperture'> & Partial<DemoLimit>): DemoLimit => ({
	n: '0',
	pulseBasis: 'continuous',
	pulseTrainExponent: '',
	wavelengthFactorKind: 'none',
	wavelengthFactorValue: '',
	wavelengthFactorSlope: '',
	wavelengthFactorOrigin: '',
	wavelengthFactorFrom: '',
	wavelengthFactorTo: '',
	extendedAlphaMin: '',
	extendedAlphaMax: '',
	extendedExponent: '',
	limitingApertureExponent: '',
	pulseGroupingTime: '',
	citation: src,
	...l
});

// The factors of the published form, as recalled (see `src`); outside its range a factor holds its end value.
/** C_A = 10^(0.002·(λ − 700 nm)) from 700 to 1050 nm: 1 below, 5 above. */
const CA = { wavelengthFactorKind: 'exponential', wavelengthFactorSlope: '0.002', wavelengthFactorOrigin: '700 nm', wavelengthFactorFrom: '700 nm', wavelengthFactorTo: '1050 nm' } as const;
/** C_B = 10^(0.02·(λ − 450 nm)) from 450 to 600 nm (photochemical): 1 below 450 nm. */
const CB = { wavelengthFactorKind: 'exponential', wavelengthFactorSlope: '0.02', wavelengthFactorOrigin: '450 nm', wavelengthFactorFrom: '450 nm', wavelengthFactorTo: '600 nm' } as const;
/** C_C = 10^(0.018·(λ − 1150 nm)) from 1150 to 1200 nm: 1 below, held at its value at 1200 nm above (≈ 7.9, below the 8 recalled: conservative). */
const CC = { wavelengthFactorKind: 'exponential', wavelengthFactorSlope: '0.018', wavelengthFactorOrigin: '1150 nm', wavelengthFactorFrom: '1150 nm', wavelengthFactorTo: '1200 nm' } as const;
/** C_E = α/α_min between α_min = 1.5 mrad and α_max; α_max = 5 mrad for the pulse rows (its smallest value over them: conservative), 100 mrad beyond 10 s. */
const CE_PULSE = { extendedAlphaMin: '1.5 mrad', extendedAlphaMax: '5 mrad', extendedExponent: '1' } as const;
const CE_LONG = { extendedAlphaMin: '1.5 mrad', extendedAlphaMax: '100 mrad', extendedExponent: '1' } as const;
const train = { pulseBasis: 'single_pulse', pulseTrainExponent: '-0.25' } as const;

/**
 * A demonstration limit set: plausible values for the demo, never a substitute for the local code.
 * Written once per wavelength region with its factors, so no band has to be split by hand.
 */
export const demoLimits: DemoLimit[] = [
	limit({ label: 'Eye, 400–1050 nm, single pulse 100 fs – 10 ps', tissue: 'eye', wavelengthMin: '400 nm', wavelengthMax: '1050 nm', durationMin: '1e-13 s', durationMax: '10 ps', quantity: 'radiant_exposure', k: '1.5e-4 J/m²', limitingAperture: '7 mm', ...train, pulseGroupingTime: '5 µs', ...CA, ...CE_PULSE }),
	limit({ label: 'Eye, 400–1050 nm, single pulse 10 ps – 5 µs', tissue: 'eye', wavelengthMin: '400 nm', wavelengthMax: '1050 nm', durationMin: '10 ps', durationMax: '5 µs', quantity: 'radiant_exposure', k: '2e-3 J/m²', limitingAperture: '7 mm', ...train, pulseGroupingTime: '5 µs', ...CA, ...CE_PULSE }),
	limit({ label: 'Eye, 400–1050 nm, 5 µs – 10 s', tissue: 'eye', wavelengthMin: '400 nm', wavelengthMax: '1050 nm', durationMin: '5 µs', durationMax: '10 s', quantity: 'radiant_exposure', k: '18 J/m²', n: '0.75', limitingAperture: '7 mm', ...CA, ...CE_PULSE }),
	limit({ label: 'Eye, 400–1050 nm, 10 s – 8 h (thermal)', tissue: 'eye', wavelengthMin: '400 nm', wavelengthMax: '1050 nm', durationMin: '10 s', durationMax: '30000 s', quantity: 'irradiance', k: '10 W/m²', limitingAperture: '7 mm', ...CA, ...CE_LONG }),
	limit({ label: 'Eye, 400–600 nm, 10 s – 100 s (photochemical)', tissue: 'eye', wavelengthMin: '400 nm', wavelengthMax: '600 nm', durationMin: '10 s', durationMax: '100 s', quantity: 'radiant_exposure', k: '100 J/m²', limitingAperture: '7 mm', ...CB }),
	limit({ label: 'Eye, 400–600 nm, 100 s – 8 h (photochemical)', tissue: 'eye', wavelengthMin: '400 nm', wavelengthMax: '600 nm', durationMin: '100 s', durationMax: '30000 s', quantity: 'irradiance', k: '1 W/m²', limitingAperture: '7 mm', ...CB }),
	limit({ label: 'Eye, 1050–1400 nm, single pulse 100 fs – 10 ps', tissue: 'eye', wavelengthMin: '1050 nm', wavelengthMax: '1400 nm', durationMin: '1e-13 s', durationMax: '10 ps', quantity: 'radiant_exposure', k: '1.5e-3 J/m²', limitingAperture: '7 mm', ...train, pulseGroupingTime: '13 µs', ...CC, ...CE_PULSE }),
	limit({ label: 'Eye, 1050–1400 nm, single pulse 10 ps – 13 µs', tissue: 'eye', wavelengthMin: '1050 nm', wavelengthMax: '1400 nm', durationMin: '10 ps', durationMax: '13 µs', quantity: 'radiant_exposure', k: '2e-2 J/m²', limitingAperture: '7 mm', ...train, pulseGroupingTime: '13 µs', ...CC, ...CE_PULSE }),
	limit({ label: 'Eye, 1050–1400 nm, 13 µs – 10 s', tissue: 'eye', wavelengthMin: '1050 nm', wavelengthMax: '1400 nm', durationMin: '13 µs', durationMax: '10 s', quantity: 'radiant_exposure', k: '90 J/m²', n: '0.75', limitingAperture: '7 mm', ...CC, ...CE_PULSE }),
	limit({ label: 'Eye, 1050–1400 nm, 10 s – 8 h', tissue: 'eye', wavelengthMin: '1050 nm', wavelengthMax: '1400 nm', durationMin: '10 s', durationMax: '30000 s', quantity: 'irradiance', k: '50 W/m²', limitingAperture: '7 mm', ...CC, ...CE_LONG }),
	limit({ label: 'Eye, 1500–1800 nm, 1 ns – 0.35 s', tissue: 'eye', wavelengthMin: '1500 nm', wavelengthMax: '1800 nm', durationMin: '1 ns', durationMax: '0.35 s', quantity: 'radiant_exposure', k: '1e4 J/m²', limitingAperture: '1 mm' }),
	limit({ label: 'Eye, 1500–1800 nm, 0.35 s – 10 s (aperture 1.5 mm · t^0.375)', tissue: 'eye', wavelengthMin: '1500 nm', wavelengthMax: '1800 nm', durationMin: '0.35 s', durationMax: '10 s', quantity: 'radiant_exposure', k: '1e4 J/m²', limitingAperture: '1.5 mm', limitingApertureExponent: '0.375' }),
	limit({ label: 'Eye, 1500–1800 nm, 10 s – 8 h', tissue: 'eye', wavelengthMin: '1500 nm', wavelengthMax: '1800 nm', durationMin: '10 s', durationMax: '30000 s', quantity: 'irradiance', k: '1000 W/m²', limitingAperture: '3.5 mm' }),
	limit({ label: 'Eye, 2.6 µm – 1 mm, 100 ns – 0.35 s', tissue: 'eye', wavelengthMin: '2.6 µm', wavelengthMax: '1 mm', durationMin: '100 ns', durationMax: '0.35 s', quantity: 'radiant_exposure', k: '5600 J/m²', n: '0.25', limitingAperture: '1 mm' }),
	limit({ label: 'Eye, 2.6 µm – 1 mm, 0.35 s – 10 s (aperture 1.5 mm · t^0.375)', tissue: 'eye', wavelengthMin: '2.6 µm', wavelengthMax: '1 mm', durationMin: '0.35 s', durationMax: '10 s', quantity: 'radiant_exposure', k: '5600 J/m²', n: '0.25', limitingAperture: '1.5 mm', limitingApertureExponent: '0.375' }),
	limit({ label: 'Eye, 2.6 µm – 1 mm, 10 s – 8 h', tissue: 'eye', wavelengthMin: '2.6 µm', wavelengthMax: '1 mm', durationMin: '10 s', durationMax: '30000 s', quantity: 'irradiance', k: '1000 W/m²', limitingAperture: '3.5 mm' }),
	limit({ label: 'Skin, 400–1400 nm, 100 ns – 10 s', tissue: 'skin', wavelengthMin: '400 nm', wavelengthMax: '1400 nm', durationMin: '100 ns', durationMax: '10 s', quantity: 'radiant_exposure', k: '11000 J/m²', n: '0.25', limitingAperture: '3.5 mm', ...CA }),
	limit({ label: 'Skin, 400–1400 nm, 10 s – 8 h', tissue: 'skin', wavelengthMin: '400 nm', wavelengthMax: '1400 nm', durationMin: '10 s', durationMax: '30000 s', quantity: 'irradiance', k: '2000 W/m²', limitingAperture: '3.5 mm', ...CA }),
	limit({ label: 'Skin, 1.4 µm – 1 mm, 100 ns – 10 s', tissue: 'skin', wavelengthMin: '1.4 µm', wavelengthMax: '1 mm', durationMin: '100 ns', durationMax: '10 s', quantity: 'radiant_exposure', k: '5600 J/m²', n: '0.25', limitingAperture: '3.5 mm' }),
	limit({ label: 'Skin, 1.4 µm – 1 mm, 10 s – 8 h', tissue: 'skin', wavelengthMin: '1.4 µm', wavelengthMax: '1 mm', durationMin: '10 s', durationMax: '30000 s', quantity: 'irradiance', k: '1000 W/m²', limitingAperture: '3.5 mm' })
];

export const demoAreas = [
	{ lab: 'UFL', name: 'Ultrafast LCA M2.14', building: 'Meridian Building', room: 'M2.14', interlockNotes: 'Door interlock on both entrances; beam shutter drops when opened.', signageNotes: 'Illuminated warning sign at each door.' },
	{ lab: 'SPX', name: 'Spectroscopy LCA M1.07', building: 'Meridian Building', room: 'M1.07', interlockNotes: 'Key switch on the 532 nm laser; no door interlock.', signageNotes: 'Door sign; curtain at the entrance.' },
	{ lab: 'HEL', name: 'Pulse Hall K0.02', building: 'Kestrel Annexe', room: 'K0.02', interlockNotes: 'Two-stage entry with interlocked inner door.', signageNotes: 'Illuminated sign linked to the flashlamp supply.' },
	{ lab: 'MPC', name: 'Processing bay K0.11', building: 'Kestrel Annexe', room: 'K0.11', interlockNotes: 'Cell doors interlocked to the laser emission.', signageNotes: 'Signs on the cell and the bay door.' }
] as const;

/** A demo laser: its first line comes with the laser, `moreLines` are added after; every path carries all its lines. */
type DemoLaser = {
	lab: string;
	area: string;
	owner: string;
	laser: Omit<NewLaserForm, 'labId'>;
	moreLines?: NewLaserForm['line'][];
	paths: Omit<PathForm, 'lineIds' | 'lineChoiceReason' | 'version'>[];
};

const line = (l: Partial<NewLaserForm['line']>): NewLaserForm['line'] => ({
	label: '',
	emissionGroup: '',
	mode: 'continuous',
	wavelength: '',
	wavelengthMax: '',
	power: '',
	pulseEnergy: '',
	pulseDuration: '',
	repetitionRate: '',
	beamDiameter: '',
	beamDiameterDefinition: '1/e2',
	divergence: '',
	divergenceDefinition: '1/e2',
	beamQuality: '',
	beamProfile: 'gaussian',
	hotSpotFactor: '',
	...l
});
const el = blankElement;
let pointNo = 0;
const pt = (label: string, position: string, v: Partial<PathForm['points'][number]> = {}): PathForm['points'][number] => ({
	key: `demo-${++pointNo}`,
	label,
	kind: 'intrabeam',
	tissue: 'eye',
	position,
	exposureDuration: '0.25 s',
	reflectance: '',
	viewingAngle: '',
	viewingDistance: '',
	...v
});

export const demoLasers: DemoLaser[] = [
	{
		lab: 'SPX',
		area: 'Spectroscopy LCA M1.07',
		owner: 'priya.raman@northgate.example',
		laser: { maker: 'Verdant Photonics', model: 'Solace 5G', serial: 'VS5-20931', laserClass: '4', status: 'active', notes: 'Raman excitation source on table 2.', line: line({ label: '532 nm CW', wavelength: '532 nm', power: '5 W', beamDiameter: '2.25 mm', divergence: '0.5 mrad' }) },
		paths: [
			{
				name: 'Raman excitation, table 2',
				purpose: 'Excitation of samples in the Raman cell; a 10 % pick-off feeds the power monitor.',
				nohdExposureDuration: '0.25 s',
				elements: [el('propagate', { length: '0.4 m' }), el('mirror', { label: 'M1, dielectric' }), el('propagate', { length: '0.6 m' }), el('transmission', { label: 'pick-off to monitor, 90 % through', transmission: '0.9' }), el('propagate', { length: '0.3 m' }), el('lens', { label: 'f = 50 mm into the cell', focalLength: '50 mm' }), el('enclosure', { label: 'sample cell housing', length: '0.2 m' })],
				points: [pt('Operator leaning over table 2', '0.5 m'), pt('Stray reflection off the cell window', '1.2 m', { kind: 'diffuse', reflectance: '0.04', viewingAngle: '20°', viewingDistance: '0.6 m' })]
			}
		]
	},
	{
		lab: 'UFL',
		area: 'Ultrafast LCA M2.14',
		owner: 'priya.raman@northgate.example',
		laser: { maker: 'Coldfront Lasers', model: 'Aurora 1K amplifier', serial: 'CA1K-0412', laserClass: '4', status: 'active', notes: 'Ti:sapphire regenerative amplifier.', line: line({ label: 'compressed output', mode: 'repetitive', wavelength: '800 nm', pulseEnergy: '4 mJ', pulseDuration: '35 fs', repetitionRate: '1 kHz', beamDiameter: '10 mm', divergence: '0.3 mrad', beamQuality: '1.3' }) },
		paths: [
			{
				name: 'Compressor to the pump–probe table',
				purpose: 'Pump arm of the pump–probe experiment.',
				nohdExposureDuration: '10 s',
				elements: [el('propagate', { length: '1.5 m' }), el('transmission', { label: '50:50 splitter, pump arm', transmission: '0.5' }), el('propagate', { length: '2 m' })],
				points: [pt('Alignment at the periscope', '1 m', { exposureDuration: '10 s' }), pt('Pump arm at the delay stage', '3 m', { exposureDuration: '10 s' })]
			}
		]
	},
	{
		lab: 'HEL',
		area: 'Pulse Hall K0.02',
		owner: 'tomas.weir@northgate.example',
		laser: { maker: 'Kestrel Dynamics', model: 'QS-850 Nd:YAG', serial: 'KQ850-77', laserClass: '4', status: 'active', notes: 'Flashlamp-pumped, Q-switched.', line: line({ label: '1064 nm fundamental', mode: 'repetitive', wavelength: '1064 nm', pulseEnergy: '850 mJ', pulseDuration: '8 ns', repetitionRate: '10 Hz', beamDiameter: '9 mm', divergence: '0.5 mrad', beamQuality: '2' }) },
		paths: [
			{
				name: 'Feed to target chamber B',
				purpose: 'Expanded beam into the vacuum chamber; the last 2 m run in a tube.',
				nohdExposureDuration: '10 s',
				elements: [el('expander', { label: '2× Galilean expander', magnification: '2' }), el('propagate', { length: '3 m' }), el('enclosure', { label: 'beam tube to the chamber', length: '2 m' })],
				points: [pt('Open stretch beside the expander', '1.5 m', { exposureDuration: '10 s' }), pt('Inside the tube', '4 m', { exposureDuration: '10 s' })]
			}
		]
	},
	{
		lab: 'HEL',
		area: 'Pulse Hall K0.02',
		owner: 'tomas.weir@northgate.example',
		laser: {
			maker: 'Kestrel Dynamics',
			model: 'QS-300 SHG Nd:YAG',
			serial: 'KQ300-S-12',
			laserClass: '4',
			status: 'active',
			notes: 'Frequency-doubled; the residual fundamental leaves the head with the green.',
			line: line({ label: '532 nm second harmonic', emissionGroup: 'SHG head output', mode: 'repetitive', wavelength: '532 nm', pulseEnergy: '200 mJ', pulseDuration: '6 ns', repetitionRate: '10 Hz', beamDiameter: '7 mm', divergence: '0.6 mrad' })
		},
		moreLines: [line({ label: '1064 nm residual fundamental', emissionGroup: 'SHG head output', mode: 'repetitive', wavelength: '1064 nm', pulseEnergy: '20 mJ', pulseDuration: '8 ns', repetitionRate: '10 Hz', beamDiameter: '7 mm', divergence: '0.6 mrad' })],
		paths: [
			{
				name: 'Green pump to the dye cell',
				purpose: 'Both lines travel together to the dye cell; a harmonic separator is planned but not fitted yet.',
				nohdExposureDuration: '10 s',
				elements: [el('propagate', { length: '1.2 m' }), el('mirror', { label: 'turning mirror, broadband' }), el('propagate', { length: '0.8 m' })],
				points: [pt('Operator at the turning mirror', '1.2 m', { exposureDuration: '10 s' }), pt('Entrance window of the dye cell', '2 m', { exposureDuration: '10 s' })]
			}
		]
	},
	{
		lab: 'MPC',
		area: 'Processing bay K0.11',
		owner: 'tomas.weir@northgate.example',
		laser: { maker: 'Fennwick Industrial', model: 'FL-20 fibre laser', serial: 'FW20-3310', laserClass: '4', status: 'active', notes: 'Welding head in cell 1.', line: line({ label: '1550 nm CW', wavelength: '1550 nm', power: '20 W', beamDiameter: '5 mm', divergence: '1 mrad' }) },
		paths: [
			{
				name: 'Welding head in cell 1',
				purpose: 'Collimated output focused by the welding head; the cell is closed in operation.',
				nohdExposureDuration: '10 s',
				elements: [el('enclosure', { label: 'cell 1 (closed)', length: '1 m' }), el('lens', { label: 'welding head, f = 150 mm', focalLength: '150 mm' }), el('propagate', { length: '0.6 m' })],
				points: [pt('Inside the closed cell', '0.5 m', { exposureDuration: '10 s' }), pt('Service door open, 45 cm past the focus', '1.6 m', { exposureDuration: '10 s' })]
			}
		]
	},
	{
		lab: 'SPX',
		area: 'Spectroscopy LCA M1.07',
		owner: 'priya.raman@northgate.example',
		laser: { maker: 'Lumenara', model: 'BlueMark 405', serial: 'LB405-118', laserClass: '3B', status: 'active', notes: 'Fibre-coupled into the fluorescence microscope.', line: line({ label: '405 nm CW', wavelength: '405 nm', power: '100 mW', beamDiameter: '1.5 mm', divergence: '1.5 mrad' }) },
		paths: [
			{
				name: 'Microscope coupling through ND 4',
				purpose: 'Attenuated beam for alignment of the coupling optics.',
				nohdExposureDuration: '0.25 s',
				elements: [el('transmission', { label: 'ND 4 filter', transmission: '1e-4' }), el('propagate', { length: '2 m' })],
				points: [pt('Alignment, after the ND 4 filter', '2 m')]
			}
		]
	},
	{
		lab: 'MPC',
		area: 'Processing bay K0.11',
		owner: 'tomas.weir@northgate.example',
		laser: { maker: 'Fennwick Industrial', model: 'CX-60 CO₂ cutter', serial: 'FWC60-051', laserClass: '4', status: 'active', notes: 'Flat-bed cutter with a hinged lid.', line: line({ label: '10.6 µm CW', wavelength: '10.6 µm', power: '60 W', beamDiameter: '6 mm', divergence: '2 mrad' }) },
		paths: [
			{
				name: 'Cutting head over the bed',
				purpose: 'Beam delivery to the cutting head; lid open during set-up.',
				nohdExposureDuration: '10 s',
				elements: [el('propagate', { length: '1 m' }), el('mirror', { label: 'gantry mirror' }), el('propagate', { length: '0.5 m' }), el('lens', { label: 'cutting lens, f = 127 mm', focalLength: '127 mm' }), el('propagate', { length: '0.3 m' })],
				points: [pt('Hand under the head during set-up', '1.75 m', { tissue: 'skin', exposureDuration: '10 s' }), pt('Reflection off sheet metal', '1.8 m', { kind: 'diffuse', reflectance: '0.6', viewingAngle: '30°', viewingDistance: '1 m', exposureDuration: '10 s' })]
			}
		]
	}
];

import type { EyewearForm } from '../src/lib/schemas/eyewear';

export const demoEyewear: (Omit<EyewearForm, 'labId' | 'version'> & { lab: string })[] = [
	{ lab: 'HEL', label: 'HEL-G1', location: 'hook by the inner door', frame: 'goggle', condition: 'good', lastCheckedAt: '2026-09-14', bands: [{ wavelengthMin: '1000 nm', wavelengthMax: '1100 nm', od: '7' }, { wavelengthMin: '530 nm', wavelengthMax: '535 nm', od: '2' }] },
	{ lab: 'HEL', label: 'HEL-G2', location: 'hook by the inner door', frame: 'goggle', condition: 'damaged', lastCheckedAt: '2026-09-14', bands: [{ wavelengthMin: '1000 nm', wavelengthMax: '1100 nm', od: '7' }] },
	{ lab: 'SPX', label: 'SPX-S1', location: 'cabinet at the entrance', frame: 'spectacle', condition: 'good', lastCheckedAt: '2026-06-02', bands: [{ wavelengthMin: '520 nm', wavelengthMax: '540 nm', od: '6' }, { wavelengthMin: '190 nm', wavelengthMax: '420 nm', od: '4' }] },
	{ lab: 'UFL', label: 'UFL-T3', location: 'shelf by the amplifier', frame: 'goggle', condition: 'worn', lastCheckedAt: '2026-03-20', bands: [{ wavelengthMin: '750 nm', wavelengthMax: '850 nm', od: '5' }] },
	{ lab: 'MPC', label: 'MPC-P1', location: 'bay door', frame: 'wrap-around spectacle', condition: 'good', lastCheckedAt: '2026-10-05', bands: [{ wavelengthMin: '9 µm', wavelengthMax: '11 µm', od: '6' }, { wavelengthMin: '1500 nm', wavelengthMax: '1600 nm', od: '3' }] }
];

/**
 * Demo clearances, so the eyewear check has something to show; the rest wait for review. With
 * `eyewearFromResult` the eyewear controls are the ones the assessment asks for (one per line).
 */
export const demoClearances = [
	{
		path: 'Cutting head over the bed',
		comments: 'Lid interlock stays on in production; set-up only with the lid open at reduced power.',
		eyewearFromResult: false,
		controls: [
			{ kind: 'eyewear' as const, minOd: '4', wavelength: '10.6 µm', wavelengthMax: '', details: 'for anyone in the bay during set-up' },
			{ kind: 'interlock' as const, minOd: '', wavelength: '', wavelengthMax: '', details: 'Lid interlock to emission; bypass key held by the LSO.' },
			{ kind: 'procedure' as const, minOd: '', wavelength: '', wavelengthMax: '', details: 'SOP MPC-07, set-up with the lid open.' }
		]
	},
	{
		path: 'Green pump to the dye cell',
		comments: 'Cleared until the harmonic separator is fitted; both lines are open on the table.',
		eyewearFromResult: true,
		controls: [{ kind: 'beam_stop' as const, minOd: '', wavelength: '', wavelengthMax: '', details: 'Anodised beam dump behind the dye cell.' }]
	}
];

/** Our own checklist, written from common practice for laser controlled areas. */
export const demoChecklist = {
	name: 'Laser controlled area — routine inspection',
	items: [
		'Warning signs at every entrance, legible and matching the lasers in use',
		'Entry interlocks and emergency stop tested and working',
		'Protective eyewear on hand for every wavelength in use, OD as in the clearances, in good condition',
		'Beams enclosed or kept below eye level; beam stops at the end of every path',
		'No stray reflective objects (tools, jewellery, mounts) near open beams',
		'Standard operating procedure posted and current',
		'Users authorised, with training current',
		'Laser register entries match the lasers and beam paths found',
		'Key control for Class 4 lasers in place'
	]
};

/** Inspection schedule of the demo areas, relative to the day the demo is loaded. */
export const demoInspections: { area: string; interval: number; lastDoneDaysAgo: number | null; dueInDays: number }[] = [
	{ area: 'Ultrafast LCA M2.14', interval: 6, lastDoneDaysAgo: 230, dueInDays: -48 },
	{ area: 'Spectroscopy LCA M1.07', interval: 12, lastDoneDaysAgo: 352, dueInDays: 12 },
	{ area: 'Pulse Hall K0.02', interval: 6, lastDoneDaysAgo: 200, dueInDays: -17 },
	{ area: 'Processing bay K0.11', interval: 12, lastDoneDaysAgo: 120, dueInDays: 245 }
];

/** Training records of the demo people, dated relative to the day the demo is loaded (invented). */
export const demoTraining: { person: string; topic: string; completedDaysAgo: number; validDays: number | null; notes: string }[] = [
	{ person: 'priya.raman@northgate.example', topic: 'Laser safety induction', completedDaysAgo: 345, validDays: 365, notes: 'Centre induction, half day.' },
	{ person: 'priya.raman@northgate.example', topic: 'Authorised user, Class 4, Ultrafast LCA M2.14', completedDaysAgo: 200, validDays: 730, notes: '' },
	{ person: 'tomas.weir@northgate.example', topic: 'Laser safety induction', completedDaysAgo: 370, validDays: 365, notes: 'Renewal booked.' },
	{ person: 'tomas.weir@northgate.example', topic: 'Authorised user, Class 4, Pulse Hall K0.02', completedDaysAgo: 90, validDays: 730, notes: '' },
	{ person: 'helen.achter@northgate.example', topic: 'Laser safety officer course', completedDaysAgo: 500, validDays: null, notes: 'Five-day course with examination.' },
	{ person: 'ines.varga@northgate.example', topic: 'Laser safety officer course', completedDaysAgo: 120, validDays: null, notes: '' }
];

// ---------------------------------------------------------------------------------------------
// Procedures, sign-offs, authorisations to operate and visits (invented). Days are relative to the
// day the demo is loaded; together they show every state: procedures drafted, awaiting approval,
// approved, superseded, due for review, overdue and to be reviewed; sign-offs current, lapsing,
// lapsed and owed; authorisations requested, not yet in force, active, lapsing, lapsed, refused and
// withdrawn. The demo adds no training records: the conditions use those above.

export type DemoProcedureVersion = { body: string; changeNote: string; approvedDaysAgo: number; reviewInDays: number };
export type DemoProcedure = {
	title: string;
	kind: 'operating' | 'alignment' | 'service' | 'emergency';
	/** A laser by serial, or an area by name. */
	laser?: string;
	area?: string;
	owner: string;
	paths: string[];
	versions: DemoProcedureVersion[];
	draft?: { body: string; changeNote: string; submitted: boolean };
	/** A covered path went back to review (the reason shown). */
	toReview?: string;
};

const steps = (...lines: string[]) => lines.join('\n');

export const demoProcedures: DemoProcedure[] = [
	{
		title: 'Aurora amplifier — operating procedure',
		kind: 'operating',
		laser: 'CA1K-0412',
		owner: 'priya.raman@northgate.example',
		paths: ['Compressor to the pump–probe table'],
		versions: [
			{ body: steps('# Before switching on', '', '1. Check the door interlock light is green.', '2. Put on goggles UFL-T3 (OD 5 at 750–850 nm).', '3. Close the compressor lid.', '', '# Switching on', '', '1. Pump laser on at standby.', '2. Seed on, then amplifier.'), changeNote: 'First issue', approvedDaysAgo: 400, reviewInDays: -35 },
			{ body: steps('# Before switching on', '', '1. Check the door interlock light is green.', '2. Put on goggles UFL-T3 (OD 5 at 750–850 nm).', '3. Close the compressor lid and check both beam blocks are in place.', '', '# Switching on', '', '1. Pump laser on at standby.', '2. Seed on, then amplifier.', '3. Log the output power in the lab book.'), changeNote: 'Beam blocks checked; power logged', approvedDaysAgo: 120, reviewInDays: 245 }
		]
	},
	{
		title: 'Aurora compressor alignment',
		kind: 'alignment',
		laser: 'CA1K-0412',
		owner: 'priya.raman@northgate.example',
		paths: ['Compressor to the pump–probe table'],
		versions: [],
		draft: { body: steps('# Alignment of the compressor', '', '1. Amplifier at the lowest pump current.', '2. Use the IR viewer and cards only; no tools with shiny surfaces.', '3. Two people present; the second watches the door.'), changeNote: '', submitted: false }
	},
	{
		title: 'Spectroscopy area emergency procedure',
		kind: 'emergency',
		area: 'Spectroscopy LCA M1.07',
		owner: 'priya.raman@northgate.example',
		paths: [],
		versions: [{ body: steps('# Suspected eye exposure', '', '1. Switch the lasers off with the key switch.', '2. Do not rub the eye; call the first aider.', '3. Tell the laser safety officer the same day.', '', '# Fire', '', '1. Emergency stop by the door.', '2. Leave and raise the alarm.'), changeNote: 'First issue', approvedDaysAgo: 340, reviewInDays: 20 }]
	},
	{
		title: 'QS-850 alignment of the target beam',
		kind: 'alignment',
		laser: 'KQ850-77',
		owner: 'tomas.weir@northgate.example',
		paths: ['Feed to target chamber B'],
		versions: [{ body: steps('# Alignment', '', '1. Flashlamps at minimum, Q-switch off.', '2. Goggles HEL-G1 only (OD 7 at 1000–1100 nm).', '3. Align with the HeNe guide beam first.'), changeNote: 'First issue', approvedDaysAgo: 500, reviewInDays: -130 }],
		draft: { body: steps('# Alignment', '', '1. Flashlamps at minimum, Q-switch off.', '2. Goggles HEL-G1 only (OD 7 at 1000–1100 nm); HEL-G2 is damaged.', '3. Align with the HeNe guide beam first.', '4. Beam dump in place before the Q-switch goes on.'), changeNote: 'Damaged goggles named; beam dump step', submitted: true }
	},
	{
		title: 'Processing bay operating procedure',
		kind: 'operating',
		area: 'Processing bay K0.11',
		owner: 'tomas.weir@northgate.example',
		paths: ['Welding head in cell 1'],
		versions: [
			{ body: steps('# Entering the bay', '', '1. Cell doors closed before any emission.', '2. Goggles MPC-P1 at the bay door.'), changeNote: 'First issue', approvedDaysAgo: 350, reviewInDays: 15 },
			{ body: steps('# Entering the bay', '', '1. Cell doors closed before any emission.', '2. Goggles MPC-P1 at the bay door.', '3. Fume extraction on before cutting.'), changeNote: 'Fume extraction', approvedDaysAgo: 20, reviewInDays: 345 }
		],
		toReview: 'The beam path “Welding head in cell 1” changed and went back to review.'
	},
	{
		title: 'Pulse Hall emergency procedure',
		kind: 'emergency',
		area: 'Pulse Hall K0.02',
		owner: 'tomas.weir@northgate.example',
		paths: [],
		versions: [],
		draft: { body: steps('# Emergency', '', '1. Red mushroom button by the inner door stops the flashlamp supply.', '2. Call the LSO on extension 4411.'), changeNote: 'First issue', submitted: true }
	},
	{
		title: 'MPC-07 cutter set-up with the lid open',
		kind: 'service',
		laser: 'FWC60-051',
		owner: 'tomas.weir@northgate.example',
		paths: ['Cutting head over the bed'],
		versions: [{ body: steps('# Set-up with the lid open', '', '1. Bypass key from the LSO only.', '2. Power at 5 W or less.', '3. Everyone in the bay wears MPC-P1.'), changeNote: 'First issue', approvedDaysAgo: 380, reviewInDays: 10 }]
	}
];

/** A person's sign-off of a procedure's version (1-based), so many days ago. */
export const demoSignoffs: { person: string; procedure: string; version: number; daysAgo: number }[] = [
	{ person: 'priya.raman@northgate.example', procedure: 'Aurora amplifier — operating procedure', version: 1, daysAgo: 390 },
	{ person: 'priya.raman@northgate.example', procedure: 'Aurora amplifier — operating procedure', version: 2, daysAgo: 100 },
	{ person: 'priya.raman@northgate.example', procedure: 'Spectroscopy area emergency procedure', version: 1, daysAgo: 30 },
	{ person: 'tomas.weir@northgate.example', procedure: 'QS-850 alignment of the target beam', version: 1, daysAgo: 200 },
	{ person: 'tomas.weir@northgate.example', procedure: 'Processing bay operating procedure', version: 1, daysAgo: 300 },
	{ person: 'tomas.weir@northgate.example', procedure: 'MPC-07 cutter set-up with the lid open', version: 1, daysAgo: 340 },
	{ person: 'helen.achter@northgate.example', procedure: 'MPC-07 cutter set-up with the lid open', version: 1, daysAgo: 376 }
];

export type DemoAuthorisation = {
	person: string;
	laser?: string;
	area?: string;
	state: 'granted' | 'requested' | 'refused' | 'withdrawn';
	trainings: string[];
	procedures: string[];
	askedDaysAgo: number;
	decidedDaysAgo?: number;
	note?: string;
	reason?: string;
};

export const demoAuthorisations: DemoAuthorisation[] = [
	// lapses soon: her induction expires within 30 days
	{ person: 'priya.raman@northgate.example', laser: 'CA1K-0412', state: 'granted', trainings: ['Laser safety induction', 'Authorised user, Class 4, Ultrafast LCA M2.14'], procedures: ['Aurora amplifier — operating procedure'], askedDaysAgo: 310, decidedDaysAgo: 300 },
	// active
	{ person: 'priya.raman@northgate.example', area: 'Spectroscopy LCA M1.07', state: 'granted', trainings: [], procedures: ['Spectroscopy area emergency procedure'], askedDaysAgo: 335, decidedDaysAgo: 330 },
	// requested
	{ person: 'priya.raman@northgate.example', laser: 'LB405-118', state: 'requested', trainings: [], procedures: [], askedDaysAgo: 3, note: 'Fluorescence runs from next month.' },
	// withdrawn
	{ person: 'priya.raman@northgate.example', laser: 'VS5-20931', state: 'withdrawn', trainings: [], procedures: [], askedDaysAgo: 420, decidedDaysAgo: 60, reason: 'Moved to the ultrafast group.' },
	// lapsed: his induction expired after the grant
	{ person: 'tomas.weir@northgate.example', laser: 'KQ850-77', state: 'granted', trainings: ['Laser safety induction', 'Authorised user, Class 4, Pulse Hall K0.02'], procedures: ['QS-850 alignment of the target beam'], askedDaysAgo: 305, decidedDaysAgo: 300 },
	// lapsed: a new version of the bay procedure is not signed yet; his cutter sign-off lapses soon
	{ person: 'tomas.weir@northgate.example', area: 'Processing bay K0.11', state: 'granted', trainings: [], procedures: ['Processing bay operating procedure', 'MPC-07 cutter set-up with the lid open'], askedDaysAgo: 345, decidedDaysAgo: 340 },
	// refused
	{ person: 'tomas.weir@northgate.example', laser: 'FW20-3310', state: 'refused', trainings: [], procedures: [], askedDaysAgo: 10, decidedDaysAgo: 8, note: 'Welding trials in cell 1.', reason: 'Complete the fibre laser briefing first.' },
	// lapsed: her sign-off is older than twelve months
	{ person: 'helen.achter@northgate.example', laser: 'FWC60-051', state: 'granted', trainings: ['Laser safety officer course'], procedures: ['MPC-07 cutter set-up with the lid open'], askedDaysAgo: 375, decidedDaysAgo: 370 },
	// not yet in force: granted, the alignment procedure not signed yet
	{ person: 'ines.varga@northgate.example', area: 'Pulse Hall K0.02', state: 'granted', trainings: ['Laser safety officer course'], procedures: ['QS-850 alignment of the target beam'], askedDaysAgo: 5, decidedDaysAgo: 5 }
];

export const demoVisits: { area: string; visitorName: string; organisation: string; kind: 'visitor' | 'contractor'; startsInDays: number; days: number; escort: string; briefing: string }[] = [
	{ area: 'Spectroscopy LCA M1.07', visitorName: 'Dr Lena Ostrova', organisation: 'Kelvin Optics Ltd', kind: 'visitor', startsInDays: 0, days: 1, escort: 'Priya Raman', briefing: 'Hazards of the 532 nm laser, eyewear SPX-S1, stays behind the curtain while the laser is on.' },
	{ area: 'Processing bay K0.11', visitorName: 'Marek Juhl', organisation: 'Coolant Services', kind: 'contractor', startsInDays: 2, days: 2, escort: 'Tomas Weir', briefing: 'Chiller service with both lasers off and the keys held by the LSO.' },
	{ area: 'Ultrafast LCA M2.14', visitorName: 'Year 12 school group (6)', organisation: 'Northgate Academy', kind: 'visitor', startsInDays: -14, days: 1, escort: 'Priya Raman', briefing: 'Lab tour with the amplifier off; eyewear not needed; stayed by the door.' }
];
