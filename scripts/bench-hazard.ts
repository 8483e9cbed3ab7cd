/**
 * Benchmark of the hazard engine on a synthetic campus register.
 *
 *   npx tsx scripts/bench-hazard.ts [paths=10000] [--runs=3] [--workers=0] [--reference=500]
 *
 * Generates (seeded, in-process) N beam paths × 4 points × 3 limits — a mix of continuous,
 * single-pulse and repetitive lines with a few elements each — evaluates every path with
 * `assess`, and times it against a plain float64 (Number) implementation of the same per-point
 * arithmetic run on the same data in the same process. Also cross-checks that both agree.
 *
 * Both implementations are first warmed up (compiled) on a separate register of 2000 paths drawn
 * with another seed, untimed, so that the timed run sees no input twice. The register is then
 * passed --runs times, timed in blocks of 250 paths: float64 over the whole register on its own,
 * then the engine with and without breakdown in turn, block by block, so that both modes see the
 * same machine (it may be shared, and its speed drifts). Reported: the best complete pass of each
 * (the register's wall time; all passes listed) and, as a steadier estimate on a busy machine,
 * the sum over blocks of each block's best time.
 * --workers=N (default 2, the machine's cores) also times the register split over N worker
 * threads of this process, each warmed up the same way; single-thread figures come first.
 * --reference=M compares the first M results, every written number, with the engine at 40 digits.
 * --floor=K (default 2000) records every decimal.js arithmetic call the engine makes on K paths
 * (untimed) and replays exactly those calls, on the same operands, with nothing else: the time that
 * decimal.js itself needs for the register's arithmetic, scaled to the whole register. No engine
 * built on decimal.js can be faster than that, so it bounds what the ratio to float64 can reach.
 */
import os from 'node:os';
import type Decimal from 'decimal.js';
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { assess } from '../src/lib/server/hazard/index';
import { assessAtPrecision } from '../src/lib/server/hazard/assess';
import { ASSESSMENT_PRECISION, AssessmentDec, Dec, OUTPUT_SIGNIFICANT_DIGITS, WORKING_PRECISION } from '../src/lib/server/hazard/constants';
import { toSignificantString } from '../src/lib/server/hazard/format';
import type { AssessmentInput, ElementInput, LimitInput, PointInput } from '../src/lib/server/hazard/index';

const args = process.argv.slice(2);
const flag = (name: string, fallback: number) => {
	const a = args.find((x) => x.startsWith(`--${name}=`));
	return a ? Number(a.slice(name.length + 3)) : fallback;
};
const PATHS = Number(args.find((a) => !a.startsWith('--')) ?? (isMainThread ? 10000 : (workerData as { paths: number }).paths));
const RUNS = flag('runs', 3);
const WORKERS = flag('workers', 2);
const REFERENCE = flag('reference', 500);
const FLOOR = flag('floor', 2000);
const WARM_UP_PATHS = 2000;

// ------------------------------------------------------------------ seeded data
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
let rnd = mulberry32(20240611);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
/** A decimal string with 4 significant digits, log-uniform between lo and hi. */
const logU = (lo: number, hi: number) => Math.exp(Math.log(lo) + rnd() * (Math.log(hi) - Math.log(lo))).toPrecision(4);
/** n paths drawn from the generator seeded with `seed`. */
function registerOf(n: number, seed: number): AssessmentInput[] {
	rnd = mulberry32(seed);
	return Array.from({ length: n }, (_, i) => makePath(i));
}

const WAVELENGTHS = ['405e-9', '532e-9', '800e-9', '1064e-9', '1550e-9', '10.6e-6'];
const DEFS = ['1/e', '1/e2', 'fwhm'] as const;

// Inputs are built as the product builds them (src/lib/server/assessments.ts: lineInput,
// elementInput, pointInput, limitInput): one object literal per kind, every field present (null
// when absent), so the engine sees the object shapes it sees in production.
type LimitFields = Pick<LimitInput, 'id' | 'label' | 'tissue' | 'durationMin' | 'durationMax' | 'quantity' | 'k' | 'n' | 'limitingAperture' | 'pulseBasis'> & { version: number; pulseTrainExponent?: string };
const limit = (l: LimitFields): LimitInput => ({
	id: l.id,
	version: String(l.version),
	label: l.label,
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
	citation: 'synthetic benchmark data'
});

function limitsFor(wl: string, mode: string): LimitInput[] {
	// Invented synthetic limits: shaped like real ones (k·tⁿ), values are not from any code.
	const eyeCw = limit({ id: `eye-cw-${wl}`, version: 1, label: 'eye continuous', tissue: 'eye', durationMin: '1e-6', durationMax: '3e4', quantity: 'radiant_exposure', k: '18', n: '0.75', limitingAperture: '7e-3', pulseBasis: 'continuous' });
	const eyeSp = limit({ id: `eye-sp-${wl}`, version: 2, label: 'eye single pulse', tissue: 'eye', durationMin: '1e-13', durationMax: '1e-3', quantity: 'radiant_exposure', k: '0.05', n: '0', limitingAperture: '7e-3', pulseBasis: 'single_pulse', pulseTrainExponent: '-0.25' });
	const skin = limit({ id: `skin-${mode}`, version: 1, label: 'skin', tissue: 'skin', durationMin: '1e-13', durationMax: '3e4', quantity: mode === 'continuous' ? 'irradiance' : 'radiant_exposure', k: mode === 'continuous' ? '2000' : '200', n: mode === 'continuous' ? '0' : '0.25', limitingAperture: '3.5e-3', pulseBasis: mode === 'continuous' ? 'continuous' : 'single_pulse' });
	const eyeCw2 = limit({ id: `eye-cw-irr-${wl}`, version: 1, label: 'eye continuous', tissue: 'eye', durationMin: '10', durationMax: '3e4', quantity: 'irradiance', k: '10', n: '0', limitingAperture: '1e-3', pulseBasis: 'continuous' });
	return mode === 'continuous' ? [eyeCw, eyeCw2, skin] : [eyeSp, eyeCw, skin];
}

function makePath(i: number): AssessmentInput {
	const mode = pick(['continuous', 'continuous', 'single_pulse', 'repetitive', 'repetitive'] as const);
	const wl = pick(WAVELENGTHS);
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
	const line: AssessmentInput['line'] = { mode, wavelength: wl, power, pulseEnergy, pulseDuration, repetitionRate, beamDiameter, beamDiameterDefinition, divergence, divergenceDefinition, beamQuality };
	const elements: ElementInput[] = [];
	let length = 0;
	const nEl = 2 + Math.floor(rnd() * 4);
	for (let k = 0; k < nEl; k++) {
		const r = rnd();
		if (r < 0.35) {
			const L = Number(logU(0.1, 5));
			length += L;
			elements.push({ kind: 'propagate', length: String(L), label: null });
		} else if (r < 0.5) elements.push({ kind: 'transmission', transmission: rnd().toFixed(3), label: 'attenuator' });
		else if (r < 0.65) elements.push({ kind: 'mirror', reflectance: (0.9 + rnd() / 10).toFixed(3), label: null });
		else if (r < 0.75) elements.push({ kind: 'expander', magnification: pick(['0.5', '2', '3', '5']), label: null });
		else if (r < 0.82) elements.push({ kind: 'lens', focalLength: pick(['0.05', '0.1', '0.25', '0.5']), label: null });
		else {
			const L = Number(logU(0.2, 2));
			length += L;
			elements.push({ kind: 'enclosure', length: String(L), label: null });
		}
	}
	elements.push({ kind: 'propagate', length: '2', label: null });
	length += 2;
	const points: PointInput[] = [];
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
	return { line, elements, points, limits: limitsFor(wl, mode), nohd: { exposureDuration: i % 2 ? '0.25' : '10' } };
}

// ------------------------------------------------------------------ float64 baseline
// The same formulas as the engine, on Numbers: definitions, path walk, averaging, checks, limits,
// ratios, optical density, diffuse distance and NOHD. No validation messages and no breakdown.
interface F64Point { ratio: number | null; od: number }
function f64(input: AssessmentInput): { points: F64Point[]; nohd: number } {
	const L = input.line;
	const num = (v: unknown) => Number(v);
	const toE = (v: number, d: string) => (d === '1/e' ? v : d === '1/e2' ? v / Math.SQRT2 : v / Math.sqrt(Math.LN2));
	const lambda = num(L.wavelength);
	const m2 = L.beamQuality == null ? 1 : num(L.beamQuality);
	const d0 = toE(num(L.beamDiameter), L.beamDiameterDefinition);
	const phi0 = toE(num(L.divergence), L.divergenceDefinition);
	const mode = L.mode;
	const Q = mode === 'continuous' ? 0 : num(L.pulseEnergy);
	const tau = mode === 'continuous' ? 0 : num(L.pulseDuration);
	const f = mode === 'repetitive' ? num(L.repetitionRate) : 0;
	const Pavg = mode === 'continuous' ? num(L.power) : mode === 'repetitive' ? Q * f : 0;
	const ePh = (6.62607015e-34 * 299792458) / lambda;
	void ePh;
	const limits = input.limits.map((l) => ({ tissue: l.tissue, lmin: num(l.wavelengthMin), lmax: num(l.wavelengthMax), tmin: num(l.durationMin), tmax: num(l.durationMax), irr: l.quantity === 'irradiance', k: num(l.k), n: num(l.n), df: num(l.limitingAperture), basis: l.pulseBasis, x: l.pulseTrainExponent == null ? null : num(l.pulseTrainExponent) }));
	type Snap = { from: number; to: number; dw: number; zw: number; phi: number; t: number };
	let z = 0;
	let cur: Snap = { from: 0, to: 0, dw: d0, zw: 0, phi: phi0, t: 1 };
	const snaps: Snap[] = [cur];
	const encl: [number, number][] = [];
	const next = (s: Partial<Snap>) => {
		cur.to = z;
		cur = { ...cur, ...s, from: z, to: z };
		snaps.push(cur);
	};
	for (const e of input.elements ?? []) {
		switch (e.kind) {
			case 'propagate':
			case 'enclosure': {
				const len = num(e.length);
				if (e.kind === 'enclosure' && len > 0) encl.push([z, z + len]);
				z += len;
				cur.to = z;
				break;
			}
			case 'transmission':
				next({ t: cur.t * num(e.transmission) });
				break;
			case 'mirror':
				next({ t: cur.t * (e.reflectance == null ? 1 : num(e.reflectance)) });
				break;
			case 'expander': {
				const M = num(e.magnification);
				next({ dw: cur.dw * M, phi: cur.phi / M, zw: z - M * M * (z - cur.zw) });
				break;
			}
			case 'lens': {
				const fl = num(e.focalLength);
				const dl = Math.hypot(cur.dw, cur.phi * (z - cur.zw));
				next({ dw: (2 * m2 * lambda * fl) / (Math.PI * dl), zw: z + fl, phi: dl / fl });
				break;
			}
			case 'fibre':
				next({ dw: num(e.coreDiameter), zw: z, phi: 2 * Math.asin(num(e.numericalAperture)), t: cur.t * (e.couplingTransmission == null ? 1 : num(e.couplingTransmission)) });
				break;
		}
	}
	type Plan = { basis: string; t: number | null; irrMeasure: boolean; x: number; N: number | null; train: boolean };
	const plans = (T: number | null): Plan[] =>
		mode === 'continuous'
			? [{ basis: 'continuous', t: T, irrMeasure: true, x: Pavg, N: null, train: false }]
			: mode === 'single_pulse'
				? [{ basis: 'single_pulse', t: tau, irrMeasure: false, x: Q, N: null, train: false }]
				: [
						{ basis: 'single_pulse', t: tau, irrMeasure: false, x: Q, N: null, train: false },
						{ basis: 'continuous', t: T, irrMeasure: true, x: Pavg, N: null, train: false },
						{ basis: 'single_pulse', t: tau, irrMeasure: false, x: Q, N: T === null ? null : Math.max(1, f * T), train: true }
					];
	const applies = (l: (typeof limits)[number], tissue: string, p: Plan) => l.tissue === tissue && l.basis === p.basis && (!p.train || l.x !== null) && l.lmin <= lambda && lambda <= l.lmax && l.tmin <= p.t! && p.t! <= l.tmax;
	const limitNat = (l: (typeof limits)[number], p: Plan) => {
		let v = l.k * Math.pow(p.t!, l.n);
		if (p.train && p.N !== null && l.x !== null) v *= Math.pow(p.N, l.x);
		return { v, nat: l.irr === p.irrMeasure ? v : p.irrMeasure ? v / p.t! : v * p.t! };
	};
	const points: F64Point[] = [];
	for (const pt of input.points) {
		const zp = num(pt.position);
		const T = pt.exposureDuration == null ? null : num(pt.exposureDuration);
		const diffuse = pt.kind === 'diffuse';
		const rho = diffuse ? num(pt.reflectance) : 0;
		const r = diffuse ? num(pt.viewingDistance) : 0;
		const theta = diffuse ? num(pt.viewingAngle ?? 0) : 0;
		const geometry = diffuse ? (rho * Math.cos(theta)) / (Math.PI * r * r) : 0;
		let best: number | null = null;
		let seen = snaps.filter((s) => s.from <= zp && zp <= s.to);
		if (seen.length === 0) seen = [snaps[snaps.length - 1]]; // float rounding of the summed lengths
		for (const s of seen) {
			const D = Math.hypot(s.dw, s.phi * (zp - s.zw));
			let worst: number | null = null;
			for (const p of plans(T)) {
				if (p.t === null) continue;
				const x = s.t * p.x;
				for (const l of limits) {
					if (!applies(l, pt.tissue, p)) continue;
					const davg = Math.max(D, l.df);
					const nat = diffuse ? geometry * x : x / ((Math.PI * davg * davg) / 4);
					const exposure = l.irr === p.irrMeasure ? nat : p.irrMeasure ? nat * p.t : nat / p.t;
					const ratio = exposure / limitNat(l, p).v;
					if (worst === null || ratio > worst) worst = ratio;
					if (diffuse) Math.sqrt((geometry * r * r * x) / limitNat(l, p).nat);
				}
			}
			if (worst !== null && (best === null || worst > best)) best = worst;
		}
		void encl;
		points.push({ ratio: best, od: best !== null && best > 1 ? Math.log10(best) : 0 });
	}
	// NOHD at the aperture.
	let nohd = 0;
	const Tn = input.nohd?.exposureDuration == null ? null : num(input.nohd.exposureDuration);
	for (const p of plans(Tn)) {
		if (p.t === null) continue;
		for (const l of limits) {
			if (!applies(l, 'eye', p)) continue;
			const dc = Math.sqrt((4 * p.x) / (Math.PI * limitNat(l, p).nat));
			if (dc > Math.max(d0, l.df)) nohd = Math.max(nohd, phi0 === 0 ? Infinity : Math.sqrt(dc * dc - d0 * d0) / phi0);
		}
	}
	return { points, nohd };
}

// ------------------------------------------------------------------ run
interface Summary {
	ok: boolean;
	verdict: string;
	ratios: (string | null)[];
	bytes: number;
}
const LEAN = { breakdown: false } as const;
/** Runs the engine over paths keeping only a summary of each result (as a service would). */
function runEngine(paths: AssessmentInput[], breakdown: boolean, measureJson = false): Summary[] {
	const out: Summary[] = new Array(paths.length);
	for (let i = 0; i < paths.length; i++) {
		const o = assess(breakdown ? paths[i] : { ...paths[i], options: LEAN });
		out[i] = o.ok
			? { ok: true, verdict: o.result.verdict, ratios: o.result.points.map((p) => p.worstRatio), bytes: measureJson ? JSON.stringify(o.result).length : 0 }
			: { ok: false, verdict: JSON.stringify(o.errors), ratios: [], bytes: 0 };
	}
	return out;
}
/** Compiles both implementations on paths that the timed run never sees. */
function warmUp(): void {
	const warm = registerOf(WARM_UP_PATHS, 7);
	for (let pass = 0; pass < 2; pass++) {
		runEngine(warm, true);
		runEngine(warm, false);
		for (const p of warm) f64(p);
	}
}

interface Timing {
	wall: number;
	cpu: number;
}
/** Wall time, and the CPU time of this process (all threads; steadier than wall time on a shared machine). */
function time<T>(fn: () => T): [T, Timing] {
	const c0 = process.cpuUsage();
	const t0 = process.hrtime.bigint();
	const out = fn();
	const wall = Number(process.hrtime.bigint() - t0) / 1e6;
	const c = process.cpuUsage(c0);
	return [out, { wall, cpu: (c.user + c.system) / 1000 }];
}
async function timeAsync<T>(fn: () => Promise<T>): Promise<[T, Timing]> {
	const c0 = process.cpuUsage();
	const t0 = process.hrtime.bigint();
	const out = await fn();
	const wall = Number(process.hrtime.bigint() - t0) / 1e6;
	const c = process.cpuUsage(c0);
	return [out, { wall, cpu: (c.user + c.system) / 1000 }];
}
const best = (ts: Timing[]) => ts.reduce((a, b) => (b.wall < a.wall ? b : a));
/** The decimal.js arithmetic of `paths` (with breakdown), recorded and then replayed alone; see --floor. */
function decimalFloor(paths: AssessmentInput[]): { calls: number; perPath: Record<string, number>; best: number; writing: number } {
	type Call = [name: string, x: Record<string, (y?: unknown) => unknown>, y: unknown];
	const proto = AssessmentDec.prototype as unknown as Record<string, (this: unknown, y?: unknown) => unknown>;
	const names = ['times', 'div', 'plus', 'minus', 'sqrt', 'pow', 'toNumber', 'cmp', 'lt', 'gte', 'lte'];
	const originals = names.map((n) => proto[n]);
	const calls: Call[] = [];
	const produced: Decimal[] = [];
	let depth = 0; // only the engine's own calls, not those decimal.js makes inside one
	names.forEach((n, i) => {
		proto[n] = function (this: unknown, y?: unknown) {
			const outer = depth === 0;
			if (outer) calls.push([n, this as Call[1], y]);
			depth++;
			try {
				const out = originals[i].call(this, y);
				if (outer && out instanceof AssessmentDec && out.isFinite()) produced.push(out);
				return out;
			} finally {
				depth--;
			}
		};
	});
	try {
		for (const p of paths) assess(p);
	} finally {
		names.forEach((n, i) => (proto[n] = originals[i]));
	}
	const perPath: Record<string, number> = {};
	for (const [n] of calls) perPath[n] = (perPath[n] ?? 0) + 1 / paths.length;
	// Replayed through direct calls (one switch), as cheap a dispatch as the engine's own code.
	const code = calls.map(([n]) => names.indexOf(n));
	const xs = calls.map((c) => c[1] as unknown as Decimal);
	const ys = calls.map((c) => c[2] as Decimal);
	let sink = 0; // every result is used, so that nothing is optimised away
	const replay = () => {
		for (let i = 0; i < code.length; i++) {
			const x = xs[i];
			const y = ys[i];
			switch (code[i]) {
				case 0: sink ^= x.times(y).e; break;
				case 1: sink ^= x.div(y).e; break;
				case 2: sink ^= x.plus(y).e; break;
				case 3: sink ^= x.minus(y).e; break;
				case 4: sink ^= x.sqrt().e; break;
				case 5: sink ^= x.pow(y).e; break;
				case 6: sink ^= x.toNumber() > 0 ? 1 : 0; break;
				case 7: sink ^= x.cmp(y); break;
				case 8: sink ^= x.lt(y) ? 1 : 0; break;
				case 9: sink ^= x.gte(y) ? 1 : 0; break;
				default: sink ^= x.lte(y) ? 1 : 0;
			}
		}
	};
	replay();
	const times = Array.from({ length: 5 }, () => time(replay)[1].wall);
	// Writing each value produced once with the engine's 12-digit formatter (the results write
	// about as many numbers as the arithmetic produces).
	const write = () => {
		for (let i = 0; i < produced.length; i++) sink ^= toSignificantString(produced[i], OUTPUT_SIGNIFICANT_DIGITS).length;
	};
	write();
	const writes = Array.from({ length: 5 }, () => time(write)[1].wall);
	const scale = PATHS / paths.length;
	if (sink === 0.5) console.log(sink);
	return { calls: calls.length, perPath, best: Math.min(...times) * scale, writing: Math.min(...writes) * scale };
}

const list = (ts: Timing[]) => ts.map((t) => t.wall.toFixed(0)).join(', ');

async function main(): Promise<void> {
	const register = registerOf(PATHS, 20240611);
	warmUp();

	// Passes over the register in blocks: float64, engine with breakdown, engine without, per block.
	const BLOCK = 250;
	const names = ['f64', 'on', 'off'] as const;
	type Name = (typeof names)[number];
	const passes: Record<Name, Timing[]> = { f64: [], on: [], off: [] };
	const blockBest: Record<Name, Timing[]> = { f64: [], on: [], off: [] };
	const baseline: ReturnType<typeof f64>[] = new Array(PATHS);
	const results: Summary[] = new Array(PATHS);
	const slices = Array.from({ length: Math.ceil(PATHS / BLOCK) }, (_, k) => register.slice(k * BLOCK, (k + 1) * BLOCK));
	const record = (pass: Record<Name, Timing>, name: Name, k: number, t: Timing) => {
		pass[name].wall += t.wall;
		pass[name].cpu += t.cpu;
		const prev = blockBest[name][k];
		if (!prev || t.wall < prev.wall) blockBest[name][k] = t;
	};
	for (let r = 0; r < RUNS; r++) {
		const pass: Record<Name, Timing> = { f64: { wall: 0, cpu: 0 }, on: { wall: 0, cpu: 0 }, off: { wall: 0, cpu: 0 } };
		// Float64 first, a whole pass on its own, so that it does not pay for the engine's garbage.
		slices.forEach((slice, k) => {
			const [fb, t] = time(() => slice.map((p) => f64(p)));
			if (r === 0) fb.forEach((x, i) => (baseline[k * BLOCK + i] = x));
			record(pass, 'f64', k, t);
		});
		// Then the engine, with and without breakdown in turn, block by block.
		slices.forEach((slice, k) => {
			const [on, ton] = time(() => runEngine(slice, true));
			if (r === 0) on.forEach((x, i) => (results[k * BLOCK + i] = x));
			record(pass, 'on', k, ton);
			record(pass, 'off', k, time(() => runEngine(slice, false))[1]);
		});
		for (const name of names) passes[name].push(pass[name]);
	}
	const steady = (name: Name): Timing => blockBest[name].reduce((a, t) => ({ wall: a.wall + t.wall, cpu: a.cpu + t.cpu }), { wall: 0, cpu: 0 });
	const sized = runEngine(register.slice(0, 1000), true, true);
	const singleThreadRssMB = process.resourceUsage().maxRSS / 1024;

	// Optional: the same register over worker threads of this process.
	let workerOn: Timing[] = [];
	let workerOff: Timing[] = [];
	if (WORKERS > 0) {
		const per = Math.ceil(PATHS / WORKERS);
		// A worker does not inherit tsx's loader: its entry registers tsx, then imports this file.
		const entry = `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((tsx) => { tsx.register(); return import(${JSON.stringify(import.meta.url)}); })`;
		const workers = Array.from({ length: WORKERS }, (_, w) => new Worker(entry, { eval: true, workerData: { paths: PATHS, from: w * per, to: Math.min(PATHS, (w + 1) * per) }, argv: [String(PATHS)] }));
		await Promise.all(workers.map((w) => new Promise((resolve) => w.once('message', resolve))));
		const round = (breakdown: boolean) =>
			timeAsync(() =>
				Promise.all(
					workers.map(
						(w) =>
							new Promise<Summary[]>((resolve) => {
								w.once('message', resolve);
								w.postMessage({ breakdown });
							})
					)
				).then((parts) => parts.flat())
			);
		for (let r = 0; r < RUNS; r++) {
			const [parts, t] = await round(true);
			if (parts.length !== PATHS || parts.some((p, i) => p.ratios.join() !== results[i].ratios.join())) throw new Error('worker results differ from the main thread');
			workerOn.push(t);
			workerOff.push((await round(false))[1]);
		}
		for (const w of workers) w.postMessage('exit');
	}

	// Cross-check: every worst ratio per point agrees with the float64 baseline.
	let failures = 0;
	let points = 0;
	let maxRel = 0;
	let nullMismatch = 0;
	const counts: Record<string, number> = {};
	results.forEach((out, i) => {
		if (!out.ok) {
			failures++;
			if (failures < 4) console.error('input error', out.verdict);
			return;
		}
		counts[out.verdict] = (counts[out.verdict] ?? 0) + 1;
		out.ratios.forEach((r, j) => {
			points++;
			const b = baseline[i].points[j].ratio;
			if (r === null || b === null) {
				if ((r === null) !== (b === null)) nullMismatch++;
				return;
			}
			const rel = Math.abs(Number(r) - b) / b;
			if (rel > maxRel) maxRel = rel;
		});
	});

	// Precision: whole results, every written number, against the engine run at 40 digits.
	let written = 0;
	let differing = 0;
	for (const p of register.slice(0, REFERENCE)) {
		const a = JSON.stringify(assess(p)).match(/"[^"]*"/g) ?? [];
		const b = JSON.stringify(assessAtPrecision(p, Dec)).match(/"[^"]*"/g) ?? [];
		for (let i = 0; i < Math.max(a.length, b.length); i++) {
			if (/^"-?[\d.]+(e[+-]\d+)?"$/.test(b[i] ?? '')) written++;
			if (a[i] !== b[i]) differing++;
		}
	}

	const floor = FLOOR > 0 ? decimalFloor(register.slice(0, Math.min(FLOOR, PATHS))) : null;

	const rssMB = process.resourceUsage().maxRSS / 1024;
	const avgKB = sized.reduce((a, s) => a + s.bytes, 0) / sized.length / 1024;
	const f = best(passes.f64);
	const on = best(passes.on);
	const off = best(passes.off);
	const [sf, son, soff] = [steady('f64'), steady('on'), steady('off')];
	const cpus = os.cpus();
	console.log(`register: ${PATHS} paths, ${points} points, 3 limits per path; input errors: ${failures}`);
	console.log(`verdicts: ${JSON.stringify(counts)}`);
	console.log(`machine: ${cpus.length} × ${cpus[0]?.model ?? '?'}, load average ${os.loadavg().map((l) => l.toFixed(2)).join(' ')}; node ${process.version}`);
	console.log(`single thread, engine at ${ASSESSMENT_PRECISION} digits; best of ${RUNS} passes [all passes] (warm-up: ${WARM_UP_PATHS} other paths, untimed):`);
	console.log(`  decimal engine (with breakdown):    ${on.wall.toFixed(0)} ms wall, ${on.cpu.toFixed(0)} ms CPU  (${((on.wall * 1000) / points).toFixed(1)} µs/point wall)  [${list(passes.on)}]`);
	console.log(`  decimal engine (breakdown off):     ${off.wall.toFixed(0)} ms wall, ${off.cpu.toFixed(0)} ms CPU  (${((off.wall * 1000) / points).toFixed(1)} µs/point wall)  [${list(passes.off)}]`);
	console.log(`  float64 baseline (same arithmetic): ${f.wall.toFixed(1)} ms wall, ${f.cpu.toFixed(0)} ms CPU  [${list(passes.f64)}]`);
	console.log(`  ratio engine/baseline (wall, best passes): ${(on.wall / f.wall).toFixed(1)}× with breakdown, ${(off.wall / f.wall).toFixed(1)}× breakdown off`);
	console.log(`  steady estimate (sum of each block's best): with breakdown ${son.wall.toFixed(0)} ms, breakdown off ${soff.wall.toFixed(0)} ms, float64 ${sf.wall.toFixed(0)} ms; ratio ${(son.wall / sf.wall).toFixed(1)}× / ${(soff.wall / sf.wall).toFixed(1)}×`);
	if (WORKERS > 0) {
		const won = best(workerOn);
		const woff = best(workerOff);
		console.log(`${WORKERS} worker threads in this process, best of ${RUNS}: with breakdown ${won.wall.toFixed(0)} ms wall [runs: ${list(workerOn)}], breakdown off ${woff.wall.toFixed(0)} ms wall [runs: ${list(workerOff)}]`);
	}
	if (floor) {
		const ops = Object.entries(floor.perPath)
			.sort((a, b) => b[1] - a[1])
			.map(([n, c]) => `${n} ${c.toFixed(1)}`)
			.join(', ');
		console.log(`decimal.js floor: the engine's own decimal.js calls per path (${ops}; ${(floor.calls / Math.min(FLOOR, PATHS)).toFixed(0)} in all), replayed alone on the same operands: ${floor.best.toFixed(0)} ms for the register = ${(floor.best / f.wall).toFixed(1)}× the float64 baseline; writing each value they produce once (12 digits): ${floor.writing.toFixed(0)} ms more; together ${((floor.best + floor.writing) / f.wall).toFixed(1)}× (best of 5, scaled from ${Math.min(FLOOR, PATHS)} paths)`);
	}
	console.log(`worst ratios vs float64: max relative difference ${maxRel.toExponential(2)}, null mismatches ${nullMismatch}`);
	console.log(`against the engine at ${WORKING_PRECISION} digits (first ${Math.min(REFERENCE, PATHS)} paths, ${written} written numbers): ${differing} strings differ`);
	console.log(`result JSON per path (with breakdown): ${avgKB.toFixed(1)} kB; peak RSS: ${singleThreadRssMB.toFixed(0)} MB single thread${WORKERS > 0 ? `, ${rssMB.toFixed(0)} MB with the workers` : ''}`);
	const verdict = (ms: number) => (ms < 2000 ? 'met' : 'NOT met');
	const within = (ms: number) => (ms / f.wall <= 10 ? 'met' : 'NOT met');
	console.log(`target < 2000 ms for the register, single thread: with breakdown ${verdict(on.wall)}, breakdown off ${verdict(off.wall)}${WORKERS > 0 ? `; with ${WORKERS} workers: with breakdown ${verdict(best(workerOn).wall)}, breakdown off ${verdict(best(workerOff).wall)}` : ''}`);
	console.log(`target within 10× of float64 (single thread, best passes): with breakdown ${within(on.wall)}, breakdown off ${within(off.wall)}`);
}

if (!isMainThread) {
	// Worker: the same register (same seed), its own slice of it, warmed up like the main thread.
	const { from, to } = workerData as { from: number; to: number };
	const slice = registerOf(PATHS, 20240611).slice(from, to);
	warmUp();
	parentPort!.on('message', (m: { breakdown: boolean } | 'exit') => {
		if (m === 'exit') process.exit(0);
		parentPort!.postMessage(runEngine(slice, m.breakdown));
	});
	parentPort!.postMessage('ready');
} else {
	await main();
}
