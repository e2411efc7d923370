import { readFileSync } from 'node:fs';
import { evaluateReadings, getLibraryModel, type ReadingInput } from '$lib/electrochem';
import { evaluateHeader, readingsIssues } from '$lib/schemas/electrochem';
import { serialiseResults } from '../../../src/routes/api/v1/ocv/evaluate/serialise';
import { distinctReadings } from '../../../src/routes/api/v1/ocv/evaluate/distinct';
const text = readFileSync('/tmp/ec/random.json', 'utf8');
const min = (f: () => unknown, n = 30) => { let m = Infinity; for (let i = 0; i < n; i++) { const t = performance.now(); f(); m = Math.min(m, performance.now() - t); } return m.toFixed(2); };
const body = JSON.parse(text);
const header = evaluateHeader.parse(body);
const { unique, order } = distinctReadings(header.readings as ReadingInput[]);
const model = getLibraryModel('NMC');
const res = evaluateReadings(model, unique, { declared_soc: 0.3 });
console.log({
  parse: min(() => JSON.parse(text)),
  zodHeader: min(() => evaluateHeader.parse(body)),
  issues: min(() => readingsIssues(header.readings)),
  distinct: min(() => distinctReadings(header.readings as ReadingInput[])),
  evaluate: min(() => evaluateReadings(model, unique, { declared_soc: 0.3 })),
  serialise: min(() => serialiseResults(res, order)),
});
