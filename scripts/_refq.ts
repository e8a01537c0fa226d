let sink = 0;
const ref = (i: number) => { let s = 0; for (let k = 0; k < 400; k++) s += Math.atan2(k - 200 + (i & 7), 37) + Math.log10(k + 1.5); return s; };
for (let i = 0; i < 3000; i++) sink += ref(i);
for (let rep = 0; rep < 3; rep++) {
const ts: number[] = []; let c = 0;
for (let b = 0; b < 400; b++) { const t0 = process.hrtime.bigint(); for (let i = 0; i < 10; i++) sink += ref(c++); ts.push(Number(process.hrtime.bigint() - t0) / 1e4); }
console.log(ts.slice(0, 30).map((x) => x.toFixed(1)).join(' '));
ts.sort((a, b) => a - b); console.log('  q0 .1 .25 .5 .75 .9', [0, .1, .25, .5, .75, .9].map((q) => ts[Math.floor(q * 399)].toFixed(1)).join(' '));
}
