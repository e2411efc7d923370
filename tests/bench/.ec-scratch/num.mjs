const N = 80000;
const xs = Array.from({ length: N }, (_, i) => (i % 3 === 0 ? 3 + Math.random() : i % 3 === 1 ? Math.random() : Math.random() * 0.05));
const a = (x) => String(Math.round(x * 1e6) / 1e6);
const PAD = ['', '0', '00', '000', '0000', '00000'];
function b(x) {
  let n = Math.round(x * 1e6);
  let sign = '';
  if (n < 0) { sign = '-'; n = -n; }
  const int = Math.floor(n / 1e6);
  let frac = n - int * 1e6;
  if (frac === 0) return sign + int;
  while (frac % 10 === 0) frac /= 10; // trailing zeros
  const digits = String(frac);
  // leading zeros: number of digits expected = 6 - trailing zeros removed
  return sign + int + '.' + fracStr(n - int * 1e6);
}
function fracStr(f) {
  let s = String(f);
  s = PAD[6 - s.length] + s;
  let end = 6; while (s.charCodeAt(end - 1) === 48) end--;
  return s.slice(0, end);
}
function c(x) {
  let n = Math.round(x * 1e6);
  let sign = '';
  if (n < 0) { sign = '-'; n = -n; }
  const int = Math.floor(n / 1e6);
  const f = n - int * 1e6;
  if (f === 0) return sign + int;
  return sign + int + '.' + fracStr(f);
}
const d = (x) => (Math.round(x * 1e6) / 1e6).toString();
for (const [name, fn] of [['a', a], ['c', c], ['d', d], ['a', a], ['c', c]]) {
  let t = performance.now(); let len = 0;
  for (let k = 0; k < 10; k++) for (let i = 0; i < N; i++) len += fn(xs[i]).length;
  console.log(name, ((performance.now() - t) / 10).toFixed(2), 'ms per 80k', len);
}
for (let i = 0; i < 2000; i++) if (a(xs[i]) !== c(xs[i])) { console.log('diff', xs[i], a(xs[i]), c(xs[i])); break; }
