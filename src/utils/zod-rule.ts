import type { FormItemRule } from 'element-plus';
import type { z } from 'zod';
import { describeCellIssue } from '@shared/schemas/imports';
import { issueWords } from '@shared/schemas/issue-words';

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
  if (result.success) return null;
  const issue = result.error.issues[0];
  return sentenceCase(issue ? issueWords(issue) : 'invalid value');
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
      callback(new Error(cellWords(result.error.issues[0], value)));
    },
  };
}

/**
 * What is wrong with each field of `body` in the words the CSV import uses, keyed by the field's
 * path joined with dots (as the server's field errors are); empty when the schema passes.
 */
export function fieldProblems(schema: z.ZodType, body: Record<string, unknown>): Record<string, string> {
  const result = schema.safeParse(body);
  const byField: Record<string, string> = {};
  if (result.success) return byField;
  for (const issue of result.error.issues) {
    const value = issue.path.reduce<unknown>(
      (from, key) => (from && typeof from === 'object' ? (from as Record<PropertyKey, unknown>)[key] : undefined),
      body,
    );
    byField[issue.path.join('.')] ??= cellWords(issue, value);
  }
  return byField;
}

/** The import's words for a cell's value the schema refuses. */
function cellWords(issue: z.core.$ZodIssue, value: unknown): string {
  if (value === null || (value === undefined && issue.code === 'invalid_type')) return 'Give a number';
  return sentenceCase(describeCellIssue(issue, value));
}

function sentenceCase(message: string): string {
  return message.charAt(0).toUpperCase() + message.slice(1);
}
