import type { z } from 'zod';

/*
 * What a schema's refusal means, in the words a person reads beside the field: "must be greater
 * than 0", not the validator's own "Too small: expected number to be >0". A message a schema sets
 * itself ("an e-mail address like name@example.com") is kept as it is.
 */

/** zod's own messages, which name types and operators rather than what to do. */
const BUILT_IN = /^(Too small|Too big|Invalid input|Invalid option|Invalid string|Invalid number)\b/;

/** The issue in words, without the refused value, to follow the field's name: "must be at least 0". */
export function issueWords(issue: z.core.$ZodIssue): string {
  return (BUILT_IN.test(issue.message) && words(issue)) || issue.message;
}

function words(issue: z.core.$ZodIssue): string | null {
  switch (issue.code) {
    case 'invalid_type':
      if (/received (undefined|null)$/.test(issue.message)) return 'is required';
      if (issue.expected === 'int') return 'must be a whole number';
      return `must be a ${issue.expected}`;
    case 'too_small':
      if (issue.origin === 'string')
        return Number(issue.minimum) <= 1 ? 'is required' : `must be at least ${issue.minimum} characters`;
      if (issue.origin === 'array') return `needs at least ${issue.minimum}`;
      return issue.inclusive ? `must be at least ${issue.minimum}` : `must be greater than ${issue.minimum}`;
    case 'too_big':
      if (issue.origin === 'string') return `is longer than ${issue.maximum} characters`;
      if (issue.origin === 'array') return `holds more than ${issue.maximum}`;
      return issue.inclusive ? `must be at most ${issue.maximum}` : `must be less than ${issue.maximum}`;
    case 'invalid_value':
      return `must be one of ${issue.values.map(String).join(', ')}`;
    default:
      return null;
  }
}
