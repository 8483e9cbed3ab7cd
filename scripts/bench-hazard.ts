/**
 * Benchmark of the hazard engine on a synthetic campus register (scripts/bench-register.ts).
 *
 *   npx tsx scripts/bench-hazard.ts [paths=10000] [--runs=5]
 *
 * Times, in one process and interleaved block by block (the machine is shared and its speed drifts):
 *   • the engine with its breakdown (what a save stores),
 *   • the engine without it (what the plot and the re-evaluation of a register need),
 *   • a bare float64 loop of the same formulas on the same data: the path walk, the beam at each
 *     point, every check against every applicable limit (train rule included), the optical density,
 *     the diffuse distance, the hazard distance of every beam and the worst ratio of every open
 *     stretch — no validation, no messages, no result objects.
 * Each is warmed up first on a register drawn with another seed. Reported: the best complete pass of
 * each and the ratios of the same run. Targets: the engine with the breakdown within 3× the bare loop;
 * the register under 0.5 s on one thread.
 */
import os from 'node:os';
import { evaluate } from '../src/lib/server/hazard/index';
import { registerOf, type RegisterPath } from './bench-register';

const args = process.argv.slice(2);
const PATHS = Number(args.find((a) => !a.startsWith('--')) ?? 10000);
const RUNS = Number(args.find((a) => a.startsWith('--runs='))?.slice(7) ?? 5);
const BLOCK = 250;

// ------------------------------------------------------------------ the bare float64 loop
const num = (v: string | null) => (v === null ? NaN : Number(v));
const toE = (v: number, d: string) => (d === '1/e' ? v : d === '1/e2' ? v / Math.SQRT2 : v / Math.sqrt(Math.LN2));
/** The effect group of a wavelength for a tissue: lines in the same group add up (as the engine's table). */
const groupOf = (tissue: string, lambda: number) => (tissue === 'skin' ? 0 : lambda < 400e-9 ? 1 : lambda < 1400e-9 ? 2 : 3);

interface Bare {
	ratios: (number | null)[];
	nohd: number;
	stretchRatios: number;
}

function bare({ path, limits: rawLimits }: RegisterPath): Bare {
	const limits = rawLimits.map((l) => ({ tissue: l.tissue, lmin: num(l.wavelengthMin), lmax: num(l.wavelengthMax), tmin: num(l.durationMin), tmax: num(l.durationMax), irr: l.quantity === 'irradiance', k: num(l.k), n: num(l.n), df: num(l.limitingAperture), basis: l.pulseBasis, x: l.pulseTrainExponent === null ? null : num(l.pulseTrainExponent), none: l.noTrainCorrection }));
	type Limit = (typeof limits)[number];
	type Plan = { basis: string; t: number; irr: boolean; x: number; N: number; train: boolean };
	type Origin = { z: number; dw: number; zw: number; phi: number; t: number };
	// Per line: its beam, its plans and its walk (a lens focuses each wavelength to its own waist; bands pass each its own share).
	const encl: [number, number][] = [];
	let z = 0;
	const lines = path.lines.map((L, li) => {
		const lambda = num(L.wavelength);
		const m2 = L.beamQuality === null ? 1 : num(L.beamQuality);
		const flat = L.beamProfile === 'flat_top';
		const d0 = flat ? num(L.beamDiameter) : toE(num(L.beamDiameter), L.beamDiameterDefinition);
		const phi0 = flat ? num(L.divergence) : toE(num(L.divergence), L.divergenceDefinition);
		const h = L.hotSpotFactor === null ? 1 : num(L.hotSpotFactor);
		const mode = L.mode;
		const Q = mode === 'continuous' ? 0 : num(L.pulseEnergy);
		const tau = mode === 'continuous' ? 0 : num(L.pulseDuration);
		const f = mode === 'repetitive' ? num(L.repetitionRate) : 0;
		const P = mode === 'continuous' ? num(L.power) : Q * f;
		const band = (e: (typeof path.elements)[number], fallback: number) => {
			let best = -1;
			for (const b of e.bands ?? []) if (lambda >= num(b.wavelengthMin) && lambda <= num(b.wavelengthMax) && num(b.transmission) > best) best = num(b.transmission);
			return best < 0 ? fallback : best;
		};
		let zz = 0;
		const origins: Origin[] = [{ z: 0, dw: d0, zw: 0, phi: phi0, t: 1 }];
		for (const e of path.elements) {
			const c = origins[origins.length - 1];
			switch (e.kind) {
				case 'propagate':
				case 'enclosure': {
					const len = num(e.length);
					if (li === 0 && e.kind === 'enclosure' && len > 0) encl.push([zz, zz + len]);
					zz += len;
					break;
				}
				case 'transmission':
					origins.push({ ...c, z: zz, t: c.t * band(e, num(e.transmission)) });
					break;
				case 'mirror':
					origins.push({ ...c, z: zz, t: c.t * band(e, e.reflectance === null ? 1 : num(e.reflectance)) });
					break;
				case 'expander': {
					const M = num(e.magnification);
					origins.push({ z: zz, dw: c.dw * M, phi: c.phi / M, zw: zz - M * M * (zz - c.zw), t: c.t });
					break;
				}
				case 'lens': {
					const fl = num(e.focalLength);
					const dl = Math.sqrt(c.dw * c.dw + (c.phi * (zz - c.zw)) ** 2);
					origins.push({ z: zz, dw: (2 * m2 * lambda * fl) / (Math.PI * dl), zw: zz + fl, phi: 2 * Math.atan(dl / (2 * fl)), t: c.t });
					break;
				}
				case 'fibre':
					origins.push({ z: zz, dw: num(e.coreDiameter), zw: zz, phi: 2 * Math.asin(num(e.numericalAperture)), t: c.t * (e.couplingTransmission === null ? 1 : num(e.couplingTransmission)) });
					break;
			}
		}
		z = zz;
		const plans = (T: number): Plan[] =>
			mode === 'continuous'
				? [{ basis: 'continuous', t: T, irr: true, x: P, N: 1, train: false }]
				: mode === 'single_pulse'
					? [{ basis: 'single_pulse', t: tau, irr: false, x: Q, N: 1, train: false }]
					: [
							{ basis: 'single_pulse', t: tau, irr: false, x: Q, N: 1, train: false },
							{ basis: 'continuous', t: T, irr: true, x: P, N: 1, train: false },
							{ basis: 'single_pulse', t: tau, irr: false, x: Q, N: Math.max(1, f * T), train: true }
						];
		return { lambda, h, origins, plans };
	});
	type Line = (typeof lines)[number];
	const limitOf = (l: Limit, p: Plan) => {
		let v = l.k * (l.n === 0 ? 1 : Math.pow(p.t, l.n));
		if (p.train) {
			if (l.x !== null) v *= Math.pow(p.N, l.x);
			else if (!l.none) return NaN; // incomplete
		}
		return v;
	};
	const applies = (l: Limit, lambda: number, tissue: string, p: Plan) => l.tissue === tissue && l.basis === p.basis && l.lmin <= lambda && lambda <= l.lmax && l.tmin <= p.t && p.t <= l.tmax;
	/** One line's worst ratio at z in the beam of its origin o. */
	const lineRatioAt = (line: Line, o: Origin, zp: number, tissue: string, T: number, G: number | null): number | null => {
		const D = Math.sqrt(o.dw * o.dw + (o.phi * (zp - o.zw)) ** 2);
		let worst: number | null = null;
		for (const p of line.plans(T)) {
			const x = o.t * p.x;
			for (const l of limits) {
				if (!applies(l, line.lambda, tissue, p)) continue;
				const v = limitOf(l, p);
				if (Number.isNaN(v)) continue;
				const davg = D > l.df ? D : l.df;
				const nat = G !== null ? G * x : (line.h * x) / ((Math.PI * davg * davg) / 4);
				const exposure = l.irr === p.irr ? nat : p.irr ? nat * p.t : nat / p.t;
				const ratio = exposure / v;
				if (worst === null || ratio > worst) worst = ratio;
				if (G !== null) Math.sqrt((G * x) / (l.irr === p.irr ? v : p.irr ? v / p.t : v * p.t));
			}
		}
		return worst;
	};
	/** The largest sum over effect groups of the lines' worst ratios, on the side n of the path's origins. */
	const sumAt = (n: number, zp: number, tissue: string, T: number, G: number | null): number | null => {
		const sums = [0, 0, 0, 0];
		let any = false;
		for (const line of lines) {
			const r = lineRatioAt(line, line.origins[n], zp, tissue, T, G);
			if (r === null) continue;
			any = true;
			sums[groupOf(tissue, line.lambda)] += r;
		}
		return any ? Math.max(...sums) : null;
	};
	const origins = lines[0].origins;
	const tol = 1e-9 * Math.max(1, z);
	const ratios: (number | null)[] = [];
	for (const pt of path.points) {
		const zp = num(pt.position);
		const T = pt.exposureDuration === null ? NaN : num(pt.exposureDuration);
		const diffuse = pt.kind === 'diffuse';
		const G = diffuse && pt.reflectance !== null && pt.viewingDistance !== null ? (num(pt.reflectance) * Math.cos(pt.viewingAngle === null ? 0 : num(pt.viewingAngle))) / (Math.PI * num(pt.viewingDistance) ** 2) : null;
		let best: number | null = null;
		for (let n = 0; n < origins.length; n++) {
			const o = origins[n];
			if (!((o.z <= zp + tol && (n + 1 === origins.length || origins[n + 1].z >= zp - tol)) || Math.abs(o.z - zp) <= tol)) continue;
			const r = sumAt(n, zp, pt.tissue, T, G);
			if (r !== null && (best === null || r > best)) best = r;
		}
		if (best !== null && best > 1) Math.log10(best);
		ratios.push(best);
	}
	// Hazard distance of every beam (eye, at the path's duration): analytic for a line alone in its
	// effect group, where the summed ratio falls to 1 (bracketing and bisection) for lines that add up.
	const Tn = path.nohdExposureDuration === null ? NaN : num(path.nohdExposureDuration);
	let nohd = 0;
	for (let n = 0; n < origins.length; n++) {
		type Cand = { line: Line; o: Origin; hx: number; el: number; df: number };
		const byGroup = new Map<number, Map<Line, Cand[]>>();
		for (const line of lines) {
			const o = line.origins[n];
			for (const p of line.plans(Tn))
				for (const l of limits) {
					if (!applies(l, line.lambda, 'eye', p)) continue;
					const v = limitOf(l, p);
					if (Number.isNaN(v)) continue;
					const el = l.irr === p.irr ? v : p.irr ? v / p.t : v * p.t;
					const g = groupOf('eye', line.lambda);
					let group = byGroup.get(g);
					if (!group) byGroup.set(g, (group = new Map()));
					const list = group.get(line) ?? [];
					list.push({ line, o, hx: line.h * o.t * p.x, el, df: l.df });
					group.set(line, list);
				}
		}
		for (const group of byGroup.values()) {
			if (group.size === 1) {
				for (const c of [...group.values()][0]) {
					const dc = Math.sqrt((4 * c.hx) / (Math.PI * c.el));
					if (dc > c.df && dc > c.o.dw) nohd = Math.max(nohd, c.o.phi === 0 ? Infinity : c.o.zw + Math.sqrt(dc * dc - c.o.dw * c.o.dw) / c.o.phi - c.o.z);
				}
				continue;
			}
			const sum = (zp: number) => {
				let total = 0;
				for (const list of group.values()) {
					let largest = 0;
					for (const c of list) {
						const D = Math.sqrt(c.o.dw * c.o.dw + (c.o.phi * (zp - c.o.zw)) ** 2);
						const d = D > c.df ? D : c.df;
						const r = c.hx / ((Math.PI / 4) * d * d * c.el);
						if (r > largest) largest = r;
					}
					total += largest;
				}
				return total;
			};
			const start = origins[n].z;
			let waist = start;
			for (const list of group.values()) for (const c of list) waist = Math.max(waist, c.o.zw);
			if (sum(waist) < 1) continue;
			let lo = waist;
			let step = 1;
			let hi = waist + step;
			let unbounded = false;
			while (sum(hi) >= 1) {
				lo = hi;
				step *= 2;
				hi = waist + step;
				if (step > 1e30) {
					unbounded = true;
					break;
				}
			}
			if (unbounded) {
				nohd = Infinity;
				continue;
			}
			for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
				const mid = (lo + hi) / 2;
				if (sum(mid) >= 1) lo = mid;
				else hi = mid;
			}
			nohd = Math.max(nohd, hi - start);
		}
	}
	// Worst summed ratio of every open stretch: at its ends and at each line's waist on it.
	const marks = [0, z, ...origins.map((o) => o.z), ...encl.flat()].sort((a, b) => a - b);
	let stretchRatios = 0;
	for (let i = 0; i + 1 < marks.length; i++) {
		const [a, b] = [marks[i], marks[i + 1]];
		if (b - a <= tol || encl.some(([from, to]) => from <= a + tol && b <= to + tol)) continue;
		let n = 0;
		for (let k = 0; k < origins.length; k++) if (origins[k].z <= a + tol) n = k;
		const probes = [a, b, ...lines.map((line) => Math.min(b, Math.max(a, line.origins[n].zw)))];
		for (const zp of probes) stretchRatios = Math.max(stretchRatios, sumAt(n, zp, 'eye', Tn, null) ?? 0);
	}
	return { ratios, nohd, stretchRatios };
}

// ------------------------------------------------------------------ timing
function time(fn: () => void): number {
	const t0 = process.hrtime.bigint();
	fn();
	return Number(process.hrtime.bigint() - t0) / 1e6;
}

function main() {
	const register = registerOf(PATHS, 20240611);
	const warm = registerOf(2000, 7);
	for (let i = 0; i < 3; i++) for (const p of warm) (evaluate(p.path, p.limits), evaluate(p.path, p.limits, { breakdown: false }), bare(p));

	const blocks = Array.from({ length: Math.ceil(PATHS / BLOCK) }, (_, k) => register.slice(k * BLOCK, (k + 1) * BLOCK));
	const passes = { on: [] as number[], off: [] as number[], f64: [] as number[] };
	// What each pass keeps of the results (as a service would): the verdict, the worst ratios and the NOHD.
	type Kept = { ok: boolean; verdict: string; ratios: (number | null)[]; nohd: number | null; unbounded: boolean };
	const keep = (o: ReturnType<typeof evaluate>): Kept =>
		o.ok ? { ok: true, verdict: o.result.verdict, ratios: o.result.points.map((p) => p.worstRatio), nohd: o.result.nohd.distance, unbounded: o.result.nohd.status === 'unbounded' } : { ok: false, verdict: '', ratios: [], nohd: null, unbounded: false };
	let results: Kept[] = [];
	let baseline: Bare[] = [];
	for (let r = 0; r < RUNS; r++) {
		const pass = { on: 0, off: 0, f64: 0 };
		const on: Kept[] = [];
		const f: Bare[] = [];
		for (const block of blocks) {
			pass.f64 += time(() => block.forEach((p) => f.push(bare(p))));
			pass.on += time(() => block.forEach((p) => on.push(keep(evaluate(p.path, p.limits)))));
			pass.off += time(() => block.forEach((p) => evaluate(p.path, p.limits, { breakdown: false })));
		}
		passes.on.push(pass.on);
		passes.off.push(pass.off);
		passes.f64.push(pass.f64);
		results = on;
		baseline = f;
	}

	// Cross-check: the engine and the bare loop agree on every point's worst ratio and the NOHD.
	let maxRel = 0;
	let worstAt = '';
	let mismatches = 0;
	let points = 0;
	const verdicts: Record<string, number> = {};
	results.forEach((o, i) => {
		if (!o.ok) {
			mismatches++;
			return;
		}
		verdicts[o.verdict] = (verdicts[o.verdict] ?? 0) + 1;
		o.ratios.forEach((r, j) => {
			points++;
			const b = baseline[i].ratios[j];
			if (r === null || b === null || b === 0) return;
			const d = Math.abs(r - b) / b;
			if (d > maxRel) {
				maxRel = d;
				worstAt = `path ${i} point ${j}: engine ${r}, bare ${b}`;
			}
		});
		const bn = baseline[i].nohd;
		if (o.unbounded ? bn !== Infinity : o.nohd !== null && Math.abs(o.nohd - bn) > 1e-9 * Math.max(1, bn)) mismatches++;
	});

	const best = (xs: number[]) => Math.min(...xs);
	const [on, off, f] = [best(passes.on), best(passes.off), best(passes.f64)];
	const list = (xs: number[]) => xs.map((x) => x.toFixed(0)).join(', ');
	const bytes = register.slice(0, 500).reduce((a, p) => a + JSON.stringify(evaluate(p.path, p.limits)).length, 0) / 500 / 1024;
	console.log(`register: ${PATHS} paths (${register.filter((p) => p.path.lines.length > 1).length} with 2–3 lines), ${points} points, 3 limits per path; verdicts ${JSON.stringify(verdicts)}`);
	console.log(`machine: ${os.cpus().length} × ${os.cpus()[0]?.model ?? '?'}, load ${os.loadavg().map((l) => l.toFixed(2)).join(' ')}; node ${process.version}`);
	console.log(`single thread, best of ${RUNS} passes, interleaved in blocks of ${BLOCK} [every pass]:`);
	console.log(`  engine with breakdown:    ${on.toFixed(0)} ms  [${list(passes.on)}]`);
	console.log(`  engine without breakdown: ${off.toFixed(0)} ms  [${list(passes.off)}]`);
	console.log(`  bare float64 loop:        ${f.toFixed(0)} ms  [${list(passes.f64)}]`);
	console.log(`  ratio to the bare loop: ${(on / f).toFixed(2)}× with breakdown (target ≤ 3), ${(off / f).toFixed(2)}× without`);
	console.log(`  register with breakdown under 500 ms: ${on < 500 ? 'met' : 'NOT met'}; within 3× of the bare loop: ${on / f <= 3 ? 'met' : 'NOT met'}`);
	console.log(`agreement with the bare loop: worst ratios within ${maxRel.toExponential(1)} relative${maxRel > 1e-12 ? ` (${worstAt})` : ''}; NOHD or error mismatches: ${mismatches}`);
	console.log(`result JSON per path with breakdown: ${bytes.toFixed(1)} kB; peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
}

main();
