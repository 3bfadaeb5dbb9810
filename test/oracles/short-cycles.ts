// Brute-force 4- and 6-cycle counts of a Tanner graph from row supports: explicit enumeration of the cycles
// (each 4-cycle = 2 rows + 2 shared columns; each 6-cycle = 3 rows + 3 distinct columns, one shared by each pair).
export function bruteShortCycles(rows: readonly (readonly number[])[]): { c4: number; c6: number } {
  const sets = rows.map((r) => new Set(r));
  let c4 = 0;
  let c6 = 0;
  for (let a = 0; a < rows.length; a++) {
    for (let b = a + 1; b < rows.length; b++) {
      const ab = rows[a]!.filter((x) => sets[b]!.has(x));
      c4 += (ab.length * (ab.length - 1)) / 2;
      for (let c = b + 1; c < rows.length; c++) {
        const bc = rows[b]!.filter((x) => sets[c]!.has(x));
        const ca = rows[c]!.filter((x) => sets[a]!.has(x));
        for (const x of ab) for (const y of bc) for (const z of ca) if (x !== y && y !== z && x !== z) c6++;
      }
    }
  }
  return { c4, c6 };
}
