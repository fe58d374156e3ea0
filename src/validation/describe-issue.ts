import type { core } from 'zod';

/** One zod issue as a plain phrase naming the field, e.g. `"keys.q.taxon": expected a string`. */
export function describeIssue(issue: core.$ZodIssue | undefined): string {
  if (!issue) return 'invalid value';
  const path = issue.path.map(String).join('.');
  const where = path ? `"${path}"` : 'the value';
  switch (issue.code) {
    case 'invalid_type':
      return issue.input === undefined
        ? `${where} is missing`
        : `${where} must be ${article(issue.expected)} ${issue.expected}`;
    case 'too_small':
      return `${where} must not be empty`;
    default:
      return `${where}: ${issue.message}`;
  }
}

function article(word: string): string {
  return /^[aeiou]/.test(word) ? 'an' : 'a';
}
