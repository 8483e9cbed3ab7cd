import { evaluate } from '../src/lib/server/hazard/index';
import { registerOf } from './bench-register';
const reg = registerOf(4000, 20240611);
const mode = process.argv[2] === 'on';
for (let r = 0; r < 4; r++) { const t0 = Date.now(); for (const p of reg) evaluate(p.path, p.limits, { breakdown: mode }); console.log(Date.now() - t0); }
