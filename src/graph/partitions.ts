/**
 * Set partitions of {0, …, n−1} as restricted growth strings: blocks[i] is the block of i, blocks being
 * numbered 0, 1, … in order of first appearance. There are Bell(n) of them (1, 2, 5, 15, 52, 203, … ).
 */
export function setPartitions(n: number): Int8Array[] {
  const out: Int8Array[] = [];
  const cur = new Int8Array(n);
  const grow = (i: number, blocks: number) => {
    if (i === n) {
      out.push(cur.slice());
      return;
    }
    for (let b = 0; b <= blocks; b++) {
      cur[i] = b;
      grow(i + 1, b === blocks ? blocks + 1 : blocks);
    }
  };
  if (n === 0) return [cur.slice()];
  grow(0, 0);
  return out;
}

/** Number of blocks of a restricted growth string. */
export function blockCount(blocks: Int8Array): number {
  let m = 0;
  for (const b of blocks) if (b + 1 > m) m = b + 1;
  return m;
}

/**
 * Möbius function μ(0̂, π) of the partition lattice from the finest partition to π:
 * the product over the blocks B of π of (−1)^(|B|−1)·(|B|−1)!.
 */
export function partitionMobius(blocks: Int8Array): number {
  const size = new Array<number>(blockCount(blocks)).fill(0);
  for (const b of blocks) size[b]! += 1;
  let mu = 1;
  for (const m of size) for (let j = 1; j < m; j++) mu *= -j;
  return mu;
}
