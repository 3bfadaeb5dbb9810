import { createHash } from 'node:crypto';
import { type BitMatrix, rowSupport } from '../gf2/bitmatrix.js';

/**
 * SHA-256 of a matrix's canonical text: `rows cols` then one line per row with its sorted support,
 * so the hash does not depend on the file format the matrix came from.
 */
export function matrixHash(m: BitMatrix): string {
  const h = createHash('sha256');
  h.update(`${m.rows} ${m.cols}\n`);
  for (let r = 0; r < m.rows; r++) h.update(`${rowSupport(m, r).join(' ')}\n`);
  return h.digest('hex');
}
