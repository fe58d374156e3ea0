import { parseArgs, type ParseArgsConfig } from 'node:util';
import { UsageError } from '../errors.js';
import { hasUnseen, visible } from '../text/visible.js';

type Options = NonNullable<ParseArgsConfig['options']>;

/** node:util parseArgs in strict mode, with its errors turned into one-line usage errors. --help is handled in main.ts. */
export function parseFlags<O extends Options>(command: string, args: string[], options: O) {
  let parsed;
  try {
    parsed = parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (error) {
    const negative = negativeValue(args, (error as Error).message);
    if (negative) throw new UsageError(`exine ${command}: ${negative}`);
    // node's messages run over several lines; the first says what is wrong.
    const message = ((error as Error).message.split('\n')[0] ?? '')
      .replace(/\. To specify a positional argument.*$/s, '')
      .replace(/^Unknown option/, 'unknown option')
      .replace(/argument is ambiguous\.?$/, 'needs a value (a value starting with "-" is written --flag=-1)');
    throw new UsageError(`exine ${command}: ${message.charAt(0).toLowerCase()}${message.slice(1)} (see exine ${command} --help)`);
  }
  // What is typed here is recorded in files and printed again: nothing in it may act on a terminal.
  for (const [flag, value] of Object.entries(parsed.values)) {
    if (typeof value === 'string' && hasUnseen(value)) {
      throw new UsageError(`exine ${command}: --${flag} has a control or invisible character ("${visible(value)}"); type it plainly`);
    }
  }
  return parsed;
}

// Flags whose value may be below zero; every other number flag takes only positive values.
const MAY_BE_NEGATIVE = new Set(['depth']);

/** One honest message for "--flag -3", which node reads as two flags. */
function negativeValue(args: readonly string[], message: string): string | null {
  const flag = /'--([\w-]+)/.exec(message)?.[1];
  if (!flag || !/ambiguous/.test(message)) return null;
  const value = args[args.indexOf(`--${flag}`) + 1];
  if (value === undefined || !/^-\d/.test(value)) return null;
  return MAY_BE_NEGATIVE.has(flag)
    ? `a negative --${flag} is written --${flag}=${value} (with --allow-negative-depth for a depth above the datum)`
    : `--${flag} cannot be negative ("${value}")`;
}

/** `hint` is added to the message, e.g. " (or off to drop the rule)". */
export function positiveInteger(command: string, flag: string, value: string | undefined, hint = ''): number | undefined {
  if (value === undefined) return undefined;
  if (!/^\d+$/.test(value) || Number(value) <= 0) {
    throw new UsageError(`exine ${command}: --${flag} must be a whole number above 0, not "${value}"${hint}`);
  }
  // The session file holds whole numbers exactly only up to 2^53 - 1; a larger one would be written and then refused.
  if (!Number.isSafeInteger(Number(value))) {
    throw new UsageError(`exine ${command}: --${flag} must be at most ${Number.MAX_SAFE_INTEGER}, not "${value}"${hint}`);
  }
  return Number(value);
}

export function finiteNumber(command: string, flag: string, value: string | undefined): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n)) throw new UsageError(`exine ${command}: --${flag} must be a number, not "${value}"`);
  return n;
}
