import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { issueWords } from '../../shared/schemas/issue-words';

const firstIssue = (schema: z.ZodType, value: unknown) => {
  const result = schema.safeParse(value);
  if (result.success) throw new Error('expected a refusal');
  return result.error.issues[0]!;
};

describe('issueWords', () => {
  it('says a limit in words, not the validator’s operators', () => {
    expect(issueWords(firstIssue(z.number().positive(), 0))).toBe('must be greater than 0');
    expect(issueWords(firstIssue(z.number().min(0), -1))).toBe('must be at least 0');
    expect(issueWords(firstIssue(z.number().max(120), 500))).toBe('must be at most 120');
    expect(issueWords(firstIssue(z.number().int(), 1.5))).toBe('must be a whole number');
    expect(issueWords(firstIssue(z.string().max(5), 'abcdefg'))).toBe('is longer than 5 characters');
    expect(issueWords(firstIssue(z.enum(['a', 'b']), 'c'))).toBe('must be one of a, b');
  });

  it('says a missing value is required, and a value of the wrong kind what it must be', () => {
    expect(issueWords(firstIssue(z.object({ qty: z.number() }), {}))).toBe('is required');
    expect(issueWords(firstIssue(z.number(), null))).toBe('is required');
    expect(issueWords(firstIssue(z.number(), 'ten'))).toBe('must be a number');
  });

  it('keeps a message the schema sets itself', () => {
    expect(issueWords(firstIssue(z.string().min(1, 'give the part number'), ''))).toBe('give the part number');
  });
});
