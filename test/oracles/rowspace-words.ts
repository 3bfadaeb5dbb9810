// Brute force: every nonzero vector of rowspace(H) with weight ≤ W, as sorted support strings. For small ranks only.
import { type BitMatrix, packedSupport } from '../../src/gf2/bitmatrix.js';
import { rowBasis } from '../../src/gf2/elimination.js';

export function bruteRowspaceWords(h: BitMatrix, maxWeight: number): Set<string> {
  const b = rowBasis(h).reduced;
  const out = new Set<string>();
  const s = h.stride;
  for (let mask = 1; mask < 2 ** b.rows; mask++) {
    const v = new Uint32Array(s);
    for (let i = 0; i < b.rows; i++) if (Math.floor(mask / 2 ** i) % 2 === 1) for (let x = 0; x < s; x++) v[x]! ^= b.data[i * s + x]!;
    const sup = packedSupport(v, 0, s);
    if (sup.length <= maxWeight) out.add(sup.join(','));
  }
  return out;
}
