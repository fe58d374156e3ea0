import type { core } from 'zod';

/** What a value is, in words, for "must be a string, not a number". */
function kindOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'number') return `the number ${v}`;
  if (typeof v === 'string') return `the text ${JSON.stringify(v.length > 20 ? `${v.slice(0, 20)}…` : v)}`;
  if (typeof v === 'boolean') return String(v);
  return typeof v === 'object' ? 'an object' : typeof v;
}

/** One zod issue as a plain phrase naming the field, e.g. `"keys.q.taxon" must be a string, not the number 7`. */
export function describeIssue(issue: core.$ZodIssue | undefined): string {
  if (!issue) return 'invalid value';
  const path = issue.path.map(String).join('.');
  const where = path ? `"${path}"` : 'the value';
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined) return `${where} is missing`;
      return issue.expected === 'int' ? `${where} must be a whole number, not ${kindOf(issue.input)}` : `${where} must be ${article(issue.expected)} ${issue.expected}, not ${kindOf(issue.input)}`;
    case 'too_small':
      if (issue.origin === 'number' || issue.origin === 'int') return `${where} must be ${issue.inclusive ? 'at least' : 'above'} ${issue.minimum}${issue.input === undefined ? '' : `, not ${issue.input}`}`;
      return `${where} must not be empty`;
    case 'too_big':
      if (issue.origin === 'number' || issue.origin === 'int') return `${where} must be ${issue.inclusive ? 'at most' : 'below'} ${issue.maximum}${issue.input === undefined ? '' : `, not ${issue.input}`}`;
      return `${where} is too long (at most ${issue.maximum})`;
    default:
      return `${where}: ${issue.message}`;
  }
}

function article(word: string): string {
  return /^[aeiou]/.test(word) ? 'an' : 'a';
}
