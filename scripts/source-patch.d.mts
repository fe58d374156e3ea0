// Types for source-patch.mjs, for the tests that import it.
import type { Plugin } from 'esbuild';

export type Hunk = { old: string[]; new: string[] };
export function parseUnifiedDiff(text: string): Map<string, Hunk[]>;
export function applyHunks(source: string, hunks: readonly Hunk[], file: string): string;
export function sourcePatch(packageName: string, patchFile: string): Plugin;
