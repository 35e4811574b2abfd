import { analyzeRecord } from "@teardown/engine";
import { testCircuit } from "./support/circuits/all-test-circuits.js";
const o = await analyzeRecord(testCircuit(process.argv[2]!), { now: () => performance.now() });
if (!o.ok) { console.log(o); process.exit(); }
const r = o.output.result as any;
console.log(JSON.stringify({ input: r.input, solver: r.solver, status: r.status, gaps: r.gaps, parts: Object.fromEntries(Object.entries(r.parts).map(([k, v]: any) => [k, [v.current_rms, v.current_dc, v.power]])), nets: r.nets, t: o.output.timings }, null, 0));
