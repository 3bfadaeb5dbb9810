import { InputError } from '../errors.js';

/**
 * Code-capacity noise on n qubits, each qubit independently:
 * - depolarizing: X, Y, Z each with probability p/3 (and I with 1 − p);
 * - independent: an X flip with probability p and, independently, a Z flip with probability p
 *   (so Y = both with probability p²).
 */
export type NoiseModel = 'depolarizing' | 'independent';

export const NOISE_MODELS: readonly NoiseModel[] = ['depolarizing', 'independent'];

export interface Channel {
  readonly model: NoiseModel;
  readonly p: number;
}

/** Throws InputError unless 0 < p < 1. */
export function checkChannel(ch: Channel): void {
  if (!(ch.p > 0 && ch.p < 1)) throw new InputError(`error probability must lie strictly between 0 and 1, found ${ch.p}`);
}

/** Probability that the X part (equally, the Z part) of a qubit's error is 1: 2p/3 or p. */
export function marginalFlipProbability(ch: Channel): number {
  return ch.model === 'depolarizing' ? (2 * ch.p) / 3 : ch.p;
}

/** Single-qubit Pauli distribution in the order [I, X, Y, Z]. */
export function pauliProbabilities(ch: Channel): [number, number, number, number] {
  const p = ch.p;
  if (ch.model === 'depolarizing') return [1 - p, p / 3, p / 3, p / 3];
  return [(1 - p) * (1 - p), p * (1 - p), p * p, p * (1 - p)];
}

/** ln((1 − q)/q): the prior LLR of a bit that is 1 with probability q. */
export function priorLlr(q: number): number {
  return Math.log((1 - q) / q);
}
