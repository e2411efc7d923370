import { readFileSync } from 'node:fs';
const token = readFileSync('/tmp/ec/token', 'utf8').trim();
const body = readFileSync('/tmp/ec/random.json', 'utf8');
for (let i = 0; i < 60; i++) {
  try {
    const r = await fetch('http://127.0.0.1:39990/api/v1/ocv/evaluate', { method: 'POST', headers: { authorization: 'Bearer ' + token, 'content-type': 'application/json' }, body });
    const b = await r.arrayBuffer();
    if (r.status !== 200 || i % 10 === 0) console.log(i, r.status, b.byteLength);
  } catch (e) { console.log(i, 'ERR', e.cause?.code ?? e.message); }
}
for (let i = 0; i < 30; i++) {
  try { const r = await fetch('http://127.0.0.1:39990/bench-random.json'); const b = await r.arrayBuffer(); if (i % 10 === 0 || r.status !== 200) console.log('static', i, r.status, b.byteLength); }
  catch (e) { console.log('static', i, 'ERR', e.cause?.code ?? e.message); }
}
