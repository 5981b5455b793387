import { z } from 'zod';
import { plainText } from './text';
import { versionField } from './version';

export const ROLES = ['admin', 'planner', 'buyer', 'receiving', 'line', 'supplier', 'viewer'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  planner: 'Planner',
  buyer: 'Buyer',
  receiving: 'Receiving',
  line: 'Line end',
  supplier: 'Supplier',
  viewer: 'Viewer',
};

const email = z
  .email('an e-mail address like name@example.com')
  .max(254)
  .transform((value) => value.toLowerCase());
const password = z.string().min(10, 'at least 10 characters').max(200);

export const loginRequestSchema = z.object({
  email: z
    .string()
    .trim()
    .min(1)
    .max(254)
    .transform((value) => value.toLowerCase()),
  password: z.string().min(1).max(200),
});
export type LoginRequest = z.infer<typeof loginRequestSchema>;

export const sessionUserSchema = z.object({
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  supplierCode: z.string().nullable(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const loginResponseSchema = z.object({ token: z.string(), user: sessionUserSchema });
export type LoginResponse = z.infer<typeof loginResponseSchema>;

export const userSchema = sessionUserSchema.extend({
  id: z.number().int(),
  active: z.boolean(),
  createdAt: z.string(),
  ...versionField,
});
export type User = z.infer<typeof userSchema>;

export const createUserRequestSchema = z
  .object({
    email,
    name: plainText(120),
    role: roleSchema,
    password,
    supplierCode: z.string().trim().min(1).max(20).optional(),
  })
  .refine((user) => user.role !== 'supplier' || !!user.supplierCode, {
    path: ['supplierCode'],
    message: 'a supplier user must be bound to a supplier',
  });
export type CreateUserRequest = z.infer<typeof createUserRequestSchema>;

export const updateUserRequestSchema = z
  .object({
    role: roleSchema.optional(),
    active: z.boolean().optional(),
    password: password.optional(),
    supplierCode: z.string().trim().min(1).max(20).nullable().optional(),
  })
  .refine((patch) => Object.keys(patch).length > 0, { message: 'nothing to change' });
export type UpdateUserRequest = z.infer<typeof updateUserRequestSchema>;

export const userIdParamsSchema = z.object({ id: z.coerce.number().int().positive() });

export const changePasswordRequestSchema = z
  .object({
    currentPassword: z.string().min(1).max(200),
    newPassword: password,
  })
  .refine((request) => request.newPassword !== request.currentPassword, {
    path: ['newPassword'],
    message: 'must differ from the current password',
  });
export type ChangePasswordRequest = z.infer<typeof changePasswordRequestSchema>;

/** A single-use reset link's secret part, as it appears in the e-mailed link. */
export const passwordResetTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'is not a password link');

export const passwordResetRequestSchema = z.object({ token: passwordResetTokenSchema, password });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const passwordResetInfoSchema = z.object({ email: z.string(), name: z.string(), expiresAt: z.string() });
export type PasswordResetInfo = z.infer<typeof passwordResetInfoSchema>;

export const passwordResetSentSchema = z.object({ to: z.string(), expiresAt: z.string() });
