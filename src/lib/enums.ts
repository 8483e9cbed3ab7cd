// Every closed list of the register, written once: the PostgreSQL enums, the zod schemas and the
// hazard engine all read them from here. Pure data (no imports), so drizzle-kit, the browser and the
// engine can all load it.

export const laserClasses = ['1', '1M', '2', '2M', '3R', '3B', '4'] as const;
export const laserStatuses = ['active', 'in_storage', 'retired'] as const;
export const emissionModes = ['continuous', 'single_pulse', 'repetitive'] as const;
/** How a Gaussian beam's diameter or divergence was measured. */
export const beamDefinitions = ['1/e', '1/e2', 'fwhm'] as const;
/** Gaussian (with one of the definitions above) or flat-top (entered by its full width). */
export const beamProfiles = ['gaussian', 'flat_top'] as const;
export const elementKinds = ['propagate', 'transmission', 'mirror', 'expander', 'lens', 'fibre', 'enclosure'] as const;
export const tissues = ['eye', 'skin'] as const;
export const pointKinds = ['intrabeam', 'diffuse'] as const;
export const verdicts = ['within_limit', 'exceeds_limit', 'no_applicable_limit', 'incomplete'] as const;
export const limitQuantities = ['irradiance', 'radiant_exposure'] as const;
/** A limit's wavelength factor C(λ): none (1), a constant, or 10^(s·(λ − λ₀)) (the form of C_A, C_B, C_C). */
export const wavelengthFactorKinds = ['none', 'constant', 'exponential'] as const;
export const pulseBases = ['single_pulse', 'continuous'] as const;
/** An imported limit set: checked and waiting for the officer, then published or discarded. */
export const limitImportStates = ['draft', 'published', 'discarded'] as const;

export type LaserClass = (typeof laserClasses)[number];
export type LaserStatus = (typeof laserStatuses)[number];
export type EmissionMode = (typeof emissionModes)[number];
export type BeamDefinition = (typeof beamDefinitions)[number];
export type BeamProfile = (typeof beamProfiles)[number];
export type ElementKind = (typeof elementKinds)[number];
export type Tissue = (typeof tissues)[number];
export type PointKind = (typeof pointKinds)[number];
export type Verdict = (typeof verdicts)[number];
export type LimitQuantity = (typeof limitQuantities)[number];
export type PulseBasis = (typeof pulseBases)[number];
export type WavelengthFactorKind = (typeof wavelengthFactorKinds)[number];

// Reviews, eyewear, inspections and mail (each list also feeds a pgEnum or a text column's check).
export const reviewStates = ['not_needed', 'awaiting_review', 'cleared', 'returned'] as const;
export const decisionKinds = ['cleared', 'returned'] as const;
export const controlKinds = ['eyewear', 'enclosure', 'interlock', 'signage', 'beam_stop', 'procedure', 'training', 'other'] as const;
export const eyewearConditions = ['good', 'worn', 'damaged'] as const;
export const checkOutcomes = ['pass', 'fail', 'not_applicable'] as const;
export const mailModes = ['immediate', 'digest'] as const;
