import type { FormItemRule } from 'element-plus';
import type { z } from 'zod';
import { describeCellIssue } from '@shared/schemas/imports';

/**
 * An Element Plus form rule that checks a field with the same zod schema the server applies,
 * so both sides agree on limits. Empty values pass here; pair it with a `required` rule.
 */
export function zodRule(schema: z.ZodType, trigger: 'blur' | 'change' = 'blur'): FormItemRule {
  return {
    trigger,
    validator: (_rule, value: unknown, callback: (error?: Error) => void) => {
      if (value === '' || value === null || value === undefined) return callback();
      const problem = zodProblem(schema, value);
      callback(problem ? new Error(problem) : undefined);
    },
  };
}

/** What the schema says is wrong with `value`, as a sentence; null when it passes. */
export function zodProblem(schema: z.ZodType, value: unknown): string | null {
  const result = schema.safeParse(value);
  return result.success ? null : sentenceCase(result.error.issues[0]?.message ?? 'Invalid value');
}

/**
 * Like `zodRule`, but says what is wrong in the words the CSV import uses for the same cell, so a
 * form and a file are refused alike.
 */
export function importWordsRule(schema: z.ZodType, trigger: 'blur' | 'change' = 'blur'): FormItemRule {
  return {
    trigger,
    validator: (_rule, value: unknown, callback: (error?: Error) => void) => {
      if (value === '' || value === null || value === undefined) return callback();
      const result = schema.safeParse(value);
      if (result.success) return callback();
      callback(new Error(sentenceCase(describeCellIssue(result.error.issues[0], value))));
    },
  };
}

function sentenceCase(message: string): string {
  return message.charAt(0).toUpperCase() + message.slice(1);
}
