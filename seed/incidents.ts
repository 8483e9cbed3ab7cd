// Demo incidents and near misses of the invented Northgate Photonics Centre, in different states:
// a near miss during alignment being looked into with an open corrective action, an anonymous
// suspected eye exposure with its laser suspended and a medical follow-up, a closed skin burn, a
// near miss waiting for the officer, and a researcher's unsent draft. Every detail is made up.
// Loaded through the app's own modules, so each row is validated and audited like any other.
import { addDays, format } from 'date-fns';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import * as table from '$lib/server/db/schema';
import { scopeOf } from '$lib/server/auth/scope';
import * as incidents from '$lib/server/incidents';
import * as medical from '$lib/server/medical';
import type { ReportForm } from '$lib/schemas/incidents';
import type { ContributingFactor, Severity } from '$lib/incidentWords';

type DemoIncident = {
	reporter: string;
	daysAgo: number;
	time: string;
	report: Omit<ReportForm, 'intent' | 'occurredAt' | 'areaId' | 'laserId' | 'pathId' | 'version'> & { area: string; laserSerial?: string };
	send: boolean;
	investigation?: { severity: Severity; causes: string; factors: ContributingFactor[]; procedures: string };
	actions?: { description: string; owner: string; dueInDays: number; closedWith?: string }[];
	suspend?: string;
	medical?: { requestedDaysAgo: number; doneDaysAgo: number; outcome: string };
	close?: string;
};

export const demoIncidents: DemoIncident[] = [
	{
		reporter: 'priya.raman@northgate.example',
		daysAgo: 9,
		time: '14:20',
		send: true,
		report: {
			kind: 'near_miss',
			area: 'Ultrafast LCA M2.14',
			laserSerial: 'CA1K-0412',
			locationNotes: 'compressor exit, pump–probe table',
			description:
				'During alignment of the compressor output a periscope mirror was turned past its stop and the beam went up towards the ceiling tiles. The shutter was closed within seconds; nobody was in line with it.',
			peopleInvolved: 'Two PhD students aligning the periscope',
			medicalAttention: 'not_sought',
			anonymous: false
		},
		investigation: {
			severity: 'caught',
			causes: 'The periscope top mirror had no end stop and was adjusted at full power; the beam height was not checked with a card first.',
			factors: ['alignment', 'enclosure', 'procedure'],
			procedures: 'SOP UFL-02 alignment at reduced power'
		},
		actions: [
			{ description: 'Fit end stops to both periscope mirrors on the pump–probe table', owner: 'priya.raman@northgate.example', dueInDays: 12 },
			{ description: 'Add “align at < 10 mW with the attenuator in” to SOP UFL-02 and brief the group', owner: 'helen.achter@northgate.example', dueInDays: -3 }
		]
	},
	{
		reporter: 'tomas.weir@northgate.example',
		daysAgo: 4,
		time: '10:05',
		send: true,
		report: {
			kind: 'eye_exposure',
			area: 'Processing bay K0.11',
			laserSerial: 'FW20-3310',
			locationNotes: 'cell 1 door',
			description: 'A bright flash was seen through the gap of the cell 1 door while the welding head was running with the door not fully latched. Possible reflection into the eye; no symptoms reported so far.',
			peopleInvolved: 'Visiting technician',
			medicalAttention: 'sought',
			anonymous: true
		},
		investigation: {
			severity: 'serious',
			causes: 'The door latch sensor of cell 1 reported closed with a 5 mm gap; the interlock did not stop emission.',
			factors: ['equipment', 'enclosure'],
			procedures: ''
		},
		actions: [{ description: 'Replace and test the cell 1 door latch sensor', owner: 'tomas.weir@northgate.example', dueInDays: 7 }],
		suspend: 'Cell 1 door interlock under investigation after a suspected eye exposure',
		medical: { requestedDaysAgo: 4, doneDaysAgo: 3, outcome: 'Eye examination: no lesion seen; review in four weeks' }
	},
	{
		reporter: 'tomas.weir@northgate.example',
		daysAgo: 75,
		time: '16:40',
		send: true,
		report: {
			kind: 'skin_exposure',
			area: 'Processing bay K0.11',
			laserSerial: 'FWC60-051',
			locationNotes: 'cutter bed, front left',
			description: 'A small burn on the back of the hand while removing a part from the bed with the lid open during set-up at reduced power.',
			peopleInvolved: 'One operator',
			medicalAttention: 'sought',
			anonymous: false
		},
		investigation: { severity: 'slight', causes: 'Emission was enabled from the controller while the operator reached into the bed.', factors: ['procedure', 'training'], procedures: 'SOP MPC-07' },
		actions: [{ description: 'Retrain cutter operators on the lid-open set-up steps', owner: 'tomas.weir@northgate.example', dueInDays: -40, closedWith: 'All four operators retrained; sign-off sheet filed.' }],
		close: 'Set-up with the lid open now needs the key held by the operator inside the bay.'
	},
	{
		reporter: 'priya.raman@northgate.example',
		daysAgo: 1,
		time: '11:30',
		send: true,
		report: {
			kind: 'near_miss',
			area: 'Spectroscopy LCA M1.07',
			laserSerial: 'VS5-20931',
			locationNotes: 'table 2',
			description: 'Eyewear for 1064 nm was found on the hook used for the 532 nm goggles; a colleague nearly took it into the Raman set-up.',
			peopleInvolved: '',
			medicalAttention: 'not_sought',
			anonymous: true
		}
	},
	{
		reporter: 'priya.raman@northgate.example',
		daysAgo: 0,
		time: '09:10',
		send: false,
		report: { kind: '', area: 'Spectroscopy LCA M1.07', locationNotes: '', description: 'Beam block on the microscope table is loose', peopleInvolved: '', medicalAttention: 'unknown', anonymous: false }
	}
];

async function person(email: string) {
	const [u] = await db.select().from(table.user).where(eq(table.user.email, email));
	return { user: u, scope: await scopeOf({ id: u.id, email: u.email, name: u.name, role: u.role, disabled: false }) };
}

export async function loadIncidents(officerEmail: string): Promise<number> {
	const [any] = await db.select({ id: table.incident.id }).from(table.incident).limit(1);
	if (any) return 0;
	const officer = await person(officerEmail);
	const day = (offset: number) => format(addDays(new Date(), offset), 'yyyy-MM-dd');
	for (const d of demoIncidents) {
		const reporter = await person(d.reporter);
		const [area] = await db.select({ id: table.area.id }).from(table.area).where(eq(table.area.name, d.report.area));
		const [laser] = d.report.laserSerial ? await db.select({ id: table.laser.id }).from(table.laser).where(eq(table.laser.serial, d.report.laserSerial)) : [];
		const { area: _a, laserSerial: _l, ...fields } = d.report;
		const saved = await incidents.saveReport(reporter.scope, null, {
			...fields,
			intent: d.send ? 'submit' : 'draft',
			occurredAt: `${day(-d.daysAgo)}T${d.time}`,
			areaId: area.id,
			laserId: laser?.id ?? '',
			pathId: '',
			version: 0
		});
		if (!saved.ok) throw new Error(`demo incident: ${JSON.stringify(saved)}`);
		if (!d.send) continue;
		let version = 1;
		if (d.investigation) {
			const r = await incidents.investigate(officer.scope, saved.id, { ...d.investigation, pathIds: [], eyewearIds: [], version });
			if (!r.ok) throw new Error(`demo investigation: ${JSON.stringify(r)}`);
			version++;
		}
		for (const a of d.actions ?? []) {
			const owner = await person(a.owner);
			const added = await incidents.addAction(officer.scope, saved.id, { description: a.description, ownerId: owner.user.id, dueOn: day(a.dueInDays) });
			if (!added.ok) throw new Error(`demo action: ${JSON.stringify(added)}`);
			if (a.closedWith) await incidents.closeAction(owner.scope, { actionId: added.id, evidence: a.closedWith, version: 1 });
		}
		if (d.suspend && laser) await incidents.suspendFrom(officer.scope, saved.id, { laserId: laser.id, reason: d.suspend });
		if (d.medical)
			await medical.save(officer.scope, saved.id, { examinationRequestedOn: day(-d.medical.requestedDaysAgo), examinationDoneOn: day(-d.medical.doneDaysAgo), outcome: d.medical.outcome, version: 0 });
		if (d.close) await incidents.close(officer.scope, saved.id, { closingNote: d.close, version });
	}
	return demoIncidents.length;
}
