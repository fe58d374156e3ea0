import type { Keymap } from '../keymap/keymap.js';
import type { Spike } from './concentration.js';

/** Grains still counted, newest first, as the statistics walk them. */
export interface GrainChain {
  readonly seq: number;
  readonly taxon: string;
  readonly below: GrainChain | null;
}

/**
 * What the statistics read of a level. The model's level state is one; naming
 * only these fields here keeps the statistics below the model, testable from plain counts.
 */
export interface LevelCounts {
  readonly keymap: Keymap;
  /** Grains per taxon still counted. */
  readonly counts: Readonly<Record<string, number>>;
  readonly grains: number;
  /** seq of the first still-counted grain of each taxon. */
  readonly firstSeen: Readonly<Record<string, number>>;
  /** Grains of the pollen sum since the last type new to the sum. */
  readonly sinceNewType: number;
  readonly spike: Spike | null;
  readonly stack: GrainChain | null;
}
