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
	{ email: 'marcus.oyel@northgate.example', name: 'Marcus Oyel', role: 'manager', password: 'amber-circuit-willow-28', labs: [] },
	{ email: 'sam.lind@northgate.example', name: 'Sam Lind', role: 'admin', password: 'granite-orbit-pepper-91', labs: [] }
];
