// The beam's diameter along a stored path, for the hazard zone drawing: the engine evaluated at
// evenly spaced positions (and at every element), the widest line taken at each. Pure: no database.
import type { BeamSample } from '$lib/hazardZone';
import type { BeamPath, LimitSI } from '$lib/schemas/assessment';
import { evaluate } from '$lib/server/hazard';

const SAMPLES = 120;

export function beamEnvelope(path: BeamPath, limits: LimitSI[], length: number, elementPositions: number[] = []): BeamSample[] | null {
	if (!(length > 0)) return null;
	const positions = [...new Set([...Array.from({ length: SAMPLES + 1 }, (_, i) => (length * i) / SAMPLES), ...elementPositions.filter((z) => z >= 0 && z <= length)])].sort((a, b) => a - b);
	const outcome = evaluate(
		{
			...path,
			points: positions.map((z, i) => ({ id: `b${i}`, label: '', position: String(z), tissue: 'eye' as const, kind: 'intrabeam' as const, exposureDuration: path.nohdExposureDuration ?? '0.25', reflectance: null, viewingAngle: null, viewingDistance: null }))
		},
		limits,
		{ breakdown: false }
	);
	if (!outcome.ok) return null;
	return outcome.result.points.map((p, i) => ({ position: positions[i], diameter: Math.max(0, ...p.lines.map((l) => l.beamDiameter).filter(Number.isFinite)) }));
}
