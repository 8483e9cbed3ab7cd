// Whether an authorisation to operate holds on a given day, and where a person stands with a
// procedure they must sign. Pure and shared by server and browser: the same facts and day always
// give the same answer, so the state is never stored and lapses by itself; the daily job only mails.
// Dates are 'YYYY-MM-DD' calendar days; a thing valid "until" a day is valid on that day.
import { addDays, addMonths, differenceInCalendarDays, formatISO, parseISO } from 'date-fns';

/** Shown as "lapses soon" (and mailed) from this many days before a condition ends. */
export const LAPSE_NOTICE_DAYS = 30;
export const DEFAULT_SIGNOFF_INTERVAL_MONTHS = 12;

export type Decision = 'requested' | 'granted' | 'refused' | 'withdrawn';
/**
 * requested    waiting for the officer
 * pending      granted, but a condition has not been met yet (e.g. the procedure not signed yet)
 * active       granted and every condition holds
 * lapses_soon  active, but a condition ends within LAPSE_NOTICE_DAYS
 * lapsed       granted, and a condition that held since the grant no longer does
 * refused, withdrawn   the officer's word
 */
export type AuthorisationState = 'requested' | 'pending' | 'active' | 'lapses_soon' | 'lapsed' | 'refused' | 'withdrawn';

export type TrainingFact = {
	topic: string;
	/** The person's latest completion of this topic (any case) that was not withdrawn. */
	latest: { completedOn: string; expiresOn: string | null } | null;
};

export type ProcedureFact = {
	procedureId: string;
	title: string;
	/** The current (latest) approved version, if any. */
	current: { number: number; approvedOn: string } | null;
	/** The day of the person's latest sign-off of the current version. */
	signedCurrentOn: string | null;
	/** The highest earlier version number the person signed, if any. */
	signedEarlier: number | null;
};

export type AuthorisationFacts = {
	decision: Decision;
	/** The day of the grant (for a granted one). */
	grantedOn: string | null;
	expiresOn: string | null;
	accountDisabled: boolean;
	trainings: TrainingFact[];
	procedures: ProcedureFact[];
};

export type Condition = {
	/** Names the cause when it fails: the same failure keeps its key, a new one gets a new key. */
	key: string;
	kind: 'account' | 'expiry' | 'training' | 'procedure';
	label: string;
	holds: boolean;
	/** Why it holds (until when) or why it does not, in a sentence. */
	detail: string;
	/** While it holds: its last day, if it ends by date. */
	until: string | null;
	/** When it fails: the first day it no longer held, if it held before. */
	since: string | null;
};

export type AuthorisationOutcome = {
	state: AuthorisationState;
	conditions: Condition[];
	/** The details of the failing conditions, in order. */
	reasons: string[];
	/** The failing conditions that held after the grant: each one is a lapse (audited, mailed once). */
	lapses: Condition[];
	/** While every condition holds: the last day they all do, if any ends by date. */
	validUntil: string | null;
};

const day = (d: Date) => formatISO(d, { representation: 'date' });
const nextDay = (d: string) => day(addDays(parseISO(d), 1));
const daysFrom = (today: string, d: string) => differenceInCalendarDays(parseISO(d), parseISO(today));

/** The last day a sign-off made on `signedOn` is valid: it lapses once older than the interval. */
export function signoffValidUntil(signedOn: string, intervalMonths: number): string {
	return day(addMonths(parseISO(signedOn), intervalMonths));
}

export type SignoffState = 'signed' | 'signoff_lapses_soon' | 'signoff_lapsed' | 'to_sign' | 'no_approved_version';

/** Where a person stands with a procedure: signed (until when), lapsing, lapsed, or to sign. */
export function signoffState(p: Pick<ProcedureFact, 'current' | 'signedCurrentOn'>, intervalMonths: number, today: string): { state: SignoffState; validUntil: string | null } {
	if (!p.current) return { state: 'no_approved_version', validUntil: null };
	if (!p.signedCurrentOn) return { state: 'to_sign', validUntil: null };
	const validUntil = signoffValidUntil(p.signedCurrentOn, intervalMonths);
	const left = daysFrom(today, validUntil);
	if (left < 0) return { state: 'signoff_lapsed', validUntil };
	return { state: left <= LAPSE_NOTICE_DAYS ? 'signoff_lapses_soon' : 'signed', validUntil };
}

function trainingCondition(t: TrainingFact, today: string): Condition {
	const base = { kind: 'training' as const, label: `Training “${t.topic}” current` };
	const key = `training:${t.topic.toLowerCase()}`;
	if (!t.latest) return { ...base, key: `${key}:none`, holds: false, detail: `No record of the training “${t.topic}”.`, until: null, since: null };
	const { expiresOn, completedOn } = t.latest;
	if (!expiresOn) return { ...base, key, holds: true, detail: `“${t.topic}” completed on ${completedOn}; it does not expire.`, until: null, since: null };
	if (daysFrom(today, expiresOn) >= 0) return { ...base, key, holds: true, detail: `“${t.topic}” is current until ${expiresOn}.`, until: expiresOn, since: null };
	return { ...base, key: `${key}:${expiresOn}`, holds: false, detail: `The training “${t.topic}” expired on ${expiresOn}.`, until: null, since: nextDay(expiresOn) };
}

function procedureCondition(p: ProcedureFact, intervalMonths: number, today: string): Condition {
	const base = { kind: 'procedure' as const, label: `Procedure “${p.title}” signed` };
	const key = `procedure:${p.procedureId}`;
	if (!p.current) return { ...base, key: `${key}:none`, holds: false, detail: `“${p.title}” has no approved version yet.`, until: null, since: null };
	const n = p.current.number;
	const s = signoffState(p, intervalMonths, today);
	if (s.state === 'to_sign') {
		// A new version asks everyone again: for someone who signed the one before, that is a lapse.
		if (p.signedEarlier !== null)
			return { ...base, key: `${key}:v${n}:unsigned`, holds: false, detail: `Version ${n} of “${p.title}”, approved on ${p.current.approvedOn}, is not signed yet (version ${p.signedEarlier} was).`, until: null, since: p.current.approvedOn };
		return { ...base, key: `${key}:v${n}:unsigned`, holds: false, detail: `Version ${n} of “${p.title}” is not signed yet.`, until: null, since: null };
	}
	if (s.state === 'signoff_lapsed')
		return { ...base, key: `${key}:v${n}:signed:${p.signedCurrentOn}`, holds: false, detail: `The sign-off of “${p.title}” (version ${n}, signed on ${p.signedCurrentOn}) lapsed after ${s.validUntil}.`, until: null, since: nextDay(s.validUntil!) };
	return { ...base, key: `${key}:v${n}`, holds: true, detail: `Version ${n} of “${p.title}” signed on ${p.signedCurrentOn}; the sign-off holds until ${s.validUntil}.`, until: s.validUntil, since: null };
}

/** The state of one authorisation on `today`, with every condition and why it holds or not. */
export function authorisationState(f: AuthorisationFacts, intervalMonths: number, today: string): AuthorisationOutcome {
	const conditions: Condition[] = [];
	if (f.accountDisabled) conditions.push({ key: 'account', kind: 'account', label: 'Account in use', holds: false, detail: 'The person’s account is disabled.', until: null, since: null });
	if (f.expiresOn) {
		const holds = daysFrom(today, f.expiresOn) >= 0;
		conditions.push({
			key: `expiry:${f.expiresOn}`,
			kind: 'expiry',
			label: `Within its end date (${f.expiresOn})`,
			holds,
			detail: holds ? `The authorisation runs until ${f.expiresOn}.` : `The authorisation ended on ${f.expiresOn}.`,
			until: holds ? f.expiresOn : null,
			since: holds ? null : nextDay(f.expiresOn)
		});
	}
	for (const t of f.trainings) conditions.push(trainingCondition(t, today));
	for (const p of f.procedures) conditions.push(procedureCondition(p, intervalMonths, today));

	const failing = conditions.filter((c) => !c.holds);
	const reasons = failing.map((c) => c.detail);
	const grantedOn = f.grantedOn ?? today;
	// A failure that began on or after the grant day broke a condition that held: a lapse. One
	// that was never met since the grant (a procedure not signed yet) leaves it pending.
	const lapses = f.decision === 'granted' ? failing.filter((c) => c.since !== null && c.since >= grantedOn) : [];
	const ends = conditions.map((c) => c.until).filter((u): u is string => u !== null);
	const validUntil = failing.length === 0 && ends.length ? ends.sort()[0] : null;

	let state: AuthorisationState;
	if (f.decision !== 'granted') state = f.decision;
	else if (lapses.length || failing.some((c) => c.kind === 'account')) state = 'lapsed';
	else if (failing.length) state = 'pending';
	else state = validUntil !== null && daysFrom(today, validUntil) <= LAPSE_NOTICE_DAYS ? 'lapses_soon' : 'active';
	return { state, conditions, reasons, lapses, validUntil };
}

/** May the person operate (or be in the area) today on this authorisation? */
export function isInForce(state: AuthorisationState): boolean {
	return state === 'active' || state === 'lapses_soon';
}
