// GF(2) engine benchmark (run by hand: npx tsx scripts/bench/gf2.ts). Prints milliseconds and word
// operations per second for rank and kernel on the sizes the core issue names.
import { buildFamily } from '../../src/codes/families/index.js';
import { zeros, type BitMatrix } from '../../src/gf2/bitmatrix.js';
import { rank } from '../../src/gf2/elimination.js';
import { kernel } from '../../src/gf2/kernel.js';
import { streamRng } from '../../src/parallel/seeds.js';

function randomDense(rows: number, cols: number, seed: number): BitMatrix {
  const m = zeros(rows, cols);
  const rng = streamRng(seed, 0);
  for (let i = 0; i < m.data.length; i++) m.data[i] = rng.nextU32();
  for (let r = 0; r < rows; r++) m.data[r * m.stride + m.stride - 1]! &= m.tailMask;
  return m;
}

function time<T>(f: () => T, repeat: number): { ms: number; value: T } {
  f(); // warm up
  const t0 = performance.now();
  let value!: T;
  for (let i = 0; i < repeat; i++) value = f();
  return { ms: (performance.now() - t0) / repeat, value };
}

/** Word operations of forward elimination on a dense matrix: about half the rows below each pivot are XORed, from the pivot word on. */
function eliminationWords(rows: number, cols: number, r: number): number {
  const stride = Math.ceil(cols / 32);
  let w = 0;
  for (let i = 0; i < r; i++) w += ((rows - i - 1) * (stride - Math.floor(i / 32))) / 2; // pivot i sits near column i
  return w;
}

const dense = randomDense(2000, 4000, 1);
const d = time(() => rank(dense), 3);
console.log(`rank of a random dense 2000×4000 matrix: ${d.value} in ${d.ms.toFixed(0)} ms, about ${(eliminationWords(2000, 4000, d.value) / d.ms / 1e3).toFixed(0)} M word operations/s`);

const bb = buildFamily('bb:l=12,m=12,A=x^3+y^2+y^7,B=y^3+x+x^2');
if (bb.kind !== 'css') throw new Error('css');
const hx = time(() => rank(bb.code.hx), 50);
console.log(`rank of HX of the [[288,12]] code (144×288): ${hx.value} in ${hx.ms.toFixed(2)} ms`);
const k = time(() => kernel(bb.code.hz), 50);
console.log(`kernel of HZ of the [[288,12]] code: ${k.value.rows}×${k.value.cols} basis in ${k.ms.toFixed(2)} ms`);
