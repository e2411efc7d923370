const N = 80000;
const xs = Array.from({ length: N }, (_, i) => (i % 3 === 0 ? 3 + Math.random() : i % 3 === 1 ? Math.random() : Math.random() * 0.05));
const PAD = ['', '0', '00', '000', '0000', '00000', '000000'];
const a = (x) => String(Math.round(x * 1e6) / 1e6);
function e(x) { // fixed 6 decimals from integers, no trimming
  let n = Math.round(x * 1e6); let sign = '';
  if (n < 0) { sign = '-'; n = -n; }
  const int = (n / 1e6) | 0; const f = n - int * 1e6;
  const fs = '' + f;
  return sign + int + '.' + PAD[6 - fs.length] + fs;
}
const f = (x) => x.toFixed(6);
function g(x) { // integer only
  return '' + Math.round(x * 1e6);
}
for (let r = 0; r < 2; r++) for (const [name, fn] of [['a', a], ['e', e], ['f', f], ['g', g]]) {
  let t = performance.now(); let len = 0;
  for (let k = 0; k < 10; k++) for (let i = 0; i < N; i++) len += fn(xs[i]).length;
  console.log(name, ((performance.now() - t) / 10).toFixed(2), 'ms per 80k', len);
}
