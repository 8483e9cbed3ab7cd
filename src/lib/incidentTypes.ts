// Shapes of incident data that pages receive (browser files never import types from $lib/server).
export type SuspensionInfo = {
	id: string;
	laserId: string;
	laserName: string;
	incidentId: string | null;
	incidentNumber: number | null;
	reason: string;
	suspendedAt: string;
	suspendedByName: string;
};
