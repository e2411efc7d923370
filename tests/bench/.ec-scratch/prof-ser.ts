import { evaluateReadings, getLibraryModel } from '$lib/electrochem';
import { serialiseResults } from '../../../src/routes/api/v1/ocv/evaluate/serialise';
const model = getLibraryModel('NMC');
const random = Array.from({ length: 10000 }, () => ({ ocv_v: 3.3 + Math.random() * 0.9, temperature_c: 15 + Math.random() * 20 }));
const res = evaluateReadings(model, random, { declared_soc: 0.3 });
const order = Int32Array.from(res.keys());
for (let i = 0; i < 300; i++) serialiseResults(res, order);
