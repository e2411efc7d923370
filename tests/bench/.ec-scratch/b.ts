import { z } from 'zod';
import { evaluateReadings, getLibraryModel } from '/work/main/src/lib/electrochem/index';
const readings = Array.from({ length: 10000 }, (_, i) => ({ ocv_v: 3.5 + (i % 70) / 100, temperature_c: 20 + (i % 10) }));
const body = JSON.stringify({ chemistry: 'NMC', readings });
console.log('body bytes', body.length);
const schema = z.object({ chemistry: z.string(), readings: z.array(z.object({ ocv_v: z.number(), temperature_c: z.number() })).max(10000) });
for (let k = 0; k < 5; k++) {
  let t = performance.now(); const parsed = JSON.parse(body); const tParse = performance.now() - t;
  t = performance.now(); schema.parse(parsed); const tZod = performance.now() - t;
  t = performance.now(); const res = evaluateReadings(getLibraryModel('NMC'), parsed.readings, { declared_soc: 0.3 }); const tEval = performance.now() - t;
  t = performance.now(); const out = JSON.stringify({ results: res }); const tStr = performance.now() - t;
  console.log({ tParse, tZod, tEval, tStr, outBytes: out.length });
}
