import { randomBytes } from 'node:crypto';
import { z } from 'zod';

const configSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_PATH: z.string().min(1).default('data/cardloop.sqlite'),
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters').optional(),
  JWT_TTL: z
    .string()
    .regex(/^\d+[smhd]$/, 'JWT_TTL like 8h or 30m')
    .default('8h'),
  SMTP_URL: z.url().optional(),
  MAIL_FROM: z.string().default('Cardloop <cardloop@example.com>'),
  APP_URL: z.url().default('http://localhost:3000'),
  SEED_DEMO: z.enum(['0', '1']).default('1'),
  ADMIN_EMAIL: z.email().optional(),
  ADMIN_PASSWORD: z.string().min(10, 'ADMIN_PASSWORD must be at least 10 characters').optional(),
  LOGIN_RATE_LIMIT: z.coerce.number().int().positive().default(10),
  NODE_ENV: z.string().default('development'),
});

export type AppConfig = z.infer<typeof configSchema> & { jwtSecret: string; jwtSecretGenerated: boolean };

/** Parses the environment once and fails fast with every bad variable named. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid configuration:\n${problems.join('\n')}`);
  }
  const config = parsed.data;
  if (config.SEED_DEMO === '0' && (!config.ADMIN_EMAIL || !config.ADMIN_PASSWORD)) {
    throw new Error('Invalid configuration:\n  SEED_DEMO=0 needs ADMIN_EMAIL and ADMIN_PASSWORD');
  }
  // Without a configured secret, sessions last only as long as the process: fine for the demo,
  // and the start banner says so.
  const jwtSecretGenerated = !config.JWT_SECRET;
  const jwtSecret = config.JWT_SECRET ?? randomBytes(48).toString('base64url');
  return { ...config, jwtSecret, jwtSecretGenerated };
}
