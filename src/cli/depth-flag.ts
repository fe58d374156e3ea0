import { UsageError } from '../errors.js';

/** Depths below zero are refused unless asked for: some cores are measured from a datum above the sediment. */
export function checkedDepth(depth: number | undefined, allowNegative: boolean): number | undefined {
  if (depth !== undefined && depth < 0 && !allowNegative) {
    throw new UsageError(`exine count: --depth ${depth} is below zero; if this core is measured from a datum above the sediment, add --allow-negative-depth`);
  }
  return depth;
}
