import type { BitMatrix } from '../gf2/bitmatrix.js';

/** Matrix file formats overcheck reads and writes. */
export type MatrixFormat = 'mtx' | 'alist' | 'dense' | 'json';

// Placeholder until the formats module lands: the signatures below are the contract.
export function readMatrixFile(path: string): BitMatrix {
  throw new Error(`reading ${path}: formats not implemented yet`);
}

export function writeMatrixFile(path: string, m: BitMatrix, format: MatrixFormat): void {
  throw new Error(`writing ${path} (${format}, ${m.rows}x${m.cols}): formats not implemented yet`);
}
