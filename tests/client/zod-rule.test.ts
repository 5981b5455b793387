// @vitest-environment node
import { describe, expect, it } from 'vitest';
import type { FormItemRule } from 'element-plus';
import { createUserRequestSchema } from '@shared/schemas/user';
import { zodRule } from '@/utils/zod-rule';

// Runs a rule the way Element Plus's async-validator does and returns the message, if any.
function messageFrom(rule: FormItemRule, value: unknown): string | undefined {
  let message: string | undefined;
  rule.validator!(
    rule,
    value,
    (error?: string | Error) => {
      message = error instanceof Error ? error.message : error;
    },
    {},
    {},
  );
  return message;
}

describe('zodRule', () => {
  const fields = createUserRequestSchema.shape;

  it('rejects a password the server would reject, with the schema’s own words', () => {
    expect(messageFrom(zodRule(fields.password), 'short')).toBe('At least 10 characters');
  });

  it('accepts a password the server accepts', () => {
    expect(messageFrom(zodRule(fields.password), 'long-enough-secret')).toBeUndefined();
  });

  it('rejects an address that is not an e-mail', () => {
    expect(messageFrom(zodRule(fields.email), 'not-an-address')).toBeDefined();
  });

  it('leaves empty values to the separate required rule', () => {
    expect(messageFrom(zodRule(fields.password), '')).toBeUndefined();
  });
});
