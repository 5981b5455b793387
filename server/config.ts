import { randomBytes } from 'node:crypto';
import { resolve } from 'node:path';
import { z } from 'zod';

const configSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_PATH: z.string().min(1).default('data/cardloop.sqlite'),
  /** A `postgres://` URL selects PostgreSQL (several nodes over one database); unset, SQLite at DATABASE_PATH. */
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// or postgresql:// URL')
    .optional(),
  DATABASE_POOL_SIZE: z.coerce.number().int().min(2).max(200).default(10),
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters').optional(),
  JWT_TTL: z
    .string()
    .regex(/^\d+[smhd]$/, 'JWT_TTL like 8h or 30m')
    .default('8h'),
  SMTP_URL: z.url().optional(),
  MAIL_FROM: z.string().default('Cardloop <cardloop@example.com>'),
  /** Unset: this machine on PORT, so the demo's e-mailed links work on whatever port it listens. */
  APP_URL: z.url().optional(),
  SEED_DEMO: z.enum(['0', '1']).optional(),
  ADMIN_EMAIL: z.email().optional(),
  ADMIN_PASSWORD: z.string().min(10, 'ADMIN_PASSWORD must be at least 10 characters').optional(),
  LOGIN_ACCOUNT_LIMIT: z.coerce.number().int().positive().default(10),
  LOGIN_ADDRESS_LIMIT: z.coerce.number().int().positive().default(100),
  /**
   * Whose X-Forwarded-For the app believes (the client address of sign-in throttling) and whose
   * X-Forwarded-Proto: a hop count, or addresses and subnets (`10.0.0.5, 10.0.1.0/24`, `loopback`).
   */
  TRUST_PROXY: z
    .string()
    .trim()
    .min(1)
    .default('loopback')
    .transform((value) => (/^\d+$/.test(value) ? Number(value) : value)),
  NODE_ENV: z.string().default('development'),
});

/** Where the data lives: the PostgreSQL URL, or the SQLite file under `root`. */
export function databaseTarget(config: Pick<AppConfig, 'DATABASE_URL' | 'DATABASE_PATH'>, root: string): string {
  return config.DATABASE_URL ?? resolve(root, config.DATABASE_PATH);
}

/** The database named for people: a PostgreSQL URL without its password, or the SQLite path. */
export function databaseLabel(config: Pick<AppConfig, 'DATABASE_URL' | 'DATABASE_PATH'>): string {
  if (!config.DATABASE_URL) return `SQLite ${config.DATABASE_PATH}`;
  const url = new URL(config.DATABASE_URL);
  url.password = '';
  return `PostgreSQL ${url.toString()}`;
}

export type AppConfig = Omit<z.infer<typeof configSchema>, 'SEED_DEMO' | 'APP_URL'> & {
  SEED_DEMO: '0' | '1';
  APP_URL: string;
  jwtSecret: string;
  jwtSecretGenerated: boolean;
};

/**
 * A real install (NODE_ENV=production) must say who it is and where its mail goes, and never gets
 * the demo plant or the demo mail capture by accident.
 */
function productionProblems(env: NodeJS.ProcessEnv, config: z.infer<typeof configSchema>): string[] {
  const problems: string[] = [];
  if (!config.JWT_SECRET) problems.push('JWT_SECRET is required in production (at least 32 random characters)');
  if (!config.SMTP_URL) problems.push('SMTP_URL is required in production: the embedded demo mail capture is refused');
  if (!env.APP_URL) problems.push('APP_URL is required in production: the public address used in e-mailed links');
  if (config.SEED_DEMO === '1')
    problems.push('SEED_DEMO=1 is refused in production: the demo plant is for trying Cardloop out');
  return problems;
}

/** Parses the environment once and fails fast with every bad variable named. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid configuration:\n${problems.join('\n')}`);
  }
  const production = parsed.data.NODE_ENV === 'production';
  const problems = production ? productionProblems(env, parsed.data) : [];
  if (problems.length > 0)
    throw new Error(
      `Invalid configuration for NODE_ENV=production:\n${problems.map((problem) => `  ${problem}`).join('\n')}`,
    );
  // The demo plant is the default only outside production.
  const config = {
    ...parsed.data,
    SEED_DEMO: parsed.data.SEED_DEMO ?? (production ? '0' : '1'),
    APP_URL: parsed.data.APP_URL ?? `http://localhost:${parsed.data.PORT}`,
  } as const;
  if (config.SEED_DEMO === '0' && (!config.ADMIN_EMAIL || !config.ADMIN_PASSWORD)) {
    throw new Error('Invalid configuration:\n  SEED_DEMO=0 needs ADMIN_EMAIL and ADMIN_PASSWORD');
  }
  // Without a configured secret, sessions last only as long as the process: fine for the demo,
  // and the start banner says so.
  const jwtSecretGenerated = !config.JWT_SECRET;
  const jwtSecret = config.JWT_SECRET ?? randomBytes(48).toString('base64url');
  return { ...config, jwtSecret, jwtSecretGenerated };
}
