import type { FormItemRule } from 'element-plus';
import { changePasswordRequestSchema, passwordResetRequestSchema } from '@shared/schemas/user';

/*
 * The rules a new password meets, taken from the shared schemas the server applies, worded for
 * the form: both password forms (change and reset) check with these before sending.
 */

function sentence(message: string): string {
  return message.charAt(0).toUpperCase() + message.slice(1);
}

/**
 * Why a new password would be refused, or '' when it would not: its length, and, when the current
 * password is given, that it differs from it.
 */
export function newPasswordProblem(newPassword: string, currentPassword?: string): string {
  if (!newPassword) return 'Choose a new password';
  const checked =
    currentPassword === undefined || currentPassword === ''
      ? passwordResetRequestSchema.shape.password.safeParse(newPassword)
      : changePasswordRequestSchema.safeParse({ currentPassword, newPassword });
  if (checked.success) return '';
  const issue = checked.error.issues.find(
    (candidate) => candidate.path.length === 0 || candidate.path[0] === 'newPassword',
  );
  return issue ? sentence(issue.message) : '';
}

/** Why the repeated password does not confirm the new one, or '' when it does. */
export function repeatProblem(newPassword: string, repeated: string): string {
  if (!repeated) return 'Type the new password again';
  return repeated === newPassword ? '' : 'The two new passwords are not the same';
}

/** An Element Plus rule that reports `problem()` for its field. */
export function passwordRule(problem: () => string): FormItemRule {
  return {
    trigger: 'blur',
    validator: (_rule, _value: unknown, callback: (error?: Error) => void) => {
      const message = problem();
      callback(message ? new Error(message) : undefined);
    },
  };
}
