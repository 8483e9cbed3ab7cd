// Which procedures can be a condition of an authorisation for a target, in the browser (the server
// checks the same rule): a laser's own and its area's; an area's own and its lasers'.
type Procedure = { id: string; title: string; laserId: string | null; areaId: string | null; approved: boolean };

export function applicableProcedures(target: string, procedures: Procedure[], lasers: { id: string; areaId: string | null }[]) {
	const [kind, id] = target.split(':');
	const areaOfLaser = new Map(lasers.map((l) => [l.id, l.areaId]));
	const fits = (p: Procedure) =>
		kind === 'laser' ? p.laserId === id || (p.areaId !== null && p.areaId === areaOfLaser.get(id)) : kind === 'area' ? p.areaId === id || (p.laserId !== null && areaOfLaser.get(p.laserId) === id) : false;
	return procedures.filter(fits).map((p) => ({ value: p.id, label: p.title, detail: p.approved ? undefined : 'no approved version yet: the authorisation waits for one' }));
}
