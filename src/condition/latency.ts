/**
 * Latency models for BP on a check matrix, run for I iterations.
 * - serial: one processor touches every edge once per iteration: I × edges (edge updates).
 * - parallel: one processor per node: I × (⌈log2 max row weight⌉ + ⌈log2 max column degree⌉ + 2), the depth of
 *   one check and one variable update as balanced trees of two-input operations (time steps).
 * - layered: checks are run layer by layer, a layer being checks that share no qubit (a greedy colouring of
 *   the rows in order, each row taking the first layer where it fits): I × layers (layer steps).
 */
export type LatencyModel = 'serial' | 'parallel' | 'layered';
export const LATENCY_MODELS: readonly LatencyModel[] = ['serial', 'parallel', 'layered'];

export const LATENCY_UNITS: Record<LatencyModel, string> = {
  serial: 'edge updates',
  parallel: 'time steps',
  layered: 'layer steps',
};

/** What the models need, maintained incrementally while rows are added. */
export interface LatencyState {
  edges: number;
  maxRowWeight: number;
  maxColDegree: number;
  layers: number;
}

export function latencyOf(model: LatencyModel, iterations: number, s: LatencyState): number {
  switch (model) {
    case 'serial':
      return iterations * s.edges;
    case 'parallel':
      return iterations * (Math.ceil(Math.log2(Math.max(1, s.maxRowWeight))) + Math.ceil(Math.log2(Math.max(1, s.maxColDegree))) + 2);
    case 'layered':
      return iterations * s.layers;
  }
}

/**
 * Greedy layering of rows (packed over `stride` words): each row goes to the first layer whose occupied
 * columns it does not touch. `layerMasks[i]` is the union of layer i's rows.
 */
export class Layering {
  readonly layerMasks: Uint32Array[] = [];
  constructor(readonly stride: number) {}

  /** The layer a row would join (layers.length means a new one). */
  layerFor(v: Uint32Array): number {
    for (let i = 0; i < this.layerMasks.length; i++) {
      const m = this.layerMasks[i]!;
      let clash = false;
      for (let x = 0; x < this.stride && !clash; x++) if (m[x]! & v[x]!) clash = true;
      if (!clash) return i;
    }
    return this.layerMasks.length;
  }

  add(v: Uint32Array): number {
    const i = this.layerFor(v);
    if (i === this.layerMasks.length) this.layerMasks.push(new Uint32Array(this.stride));
    const m = this.layerMasks[i]!;
    for (let x = 0; x < this.stride; x++) m[x] = m[x]! | v[x]!;
    return i;
  }

  get count(): number {
    return this.layerMasks.length;
  }
}
