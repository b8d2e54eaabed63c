import { z } from 'zod';

const bool = z.enum(['true', 'false']).transform((v) => v === 'true');
const port = z.coerce.number().int().min(1).max(65535);

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(3000),
  DB_HOST: z.string().min(1).default('127.0.0.1'),
  DB_PORT: port.default(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/, 'DB_NAME may hold letters, digits and _ only').default('luxtempo'),
  DB_USER: z.string().min(1).default('luxtempo_app'),
  DB_PASSWORD: z.string().min(1, 'DB_PASSWORD is required'),
  DB_OWNER_USER: z.string().min(1).default('luxtempo_owner'),
  DB_OWNER_PASSWORD: z.string().min(1, 'DB_OWNER_PASSWORD is required'),
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters'),
  SESSION_HOURS: z.coerce.number().min(1).max(24).default(12),
  COOKIE_SECURE: bool.default(false),
  TRUST_PROXY: z.string().default('loopback'),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port.default(1025),
  MAIL_FROM: z.string().min(3).default('Luxtempo <luxtempo@demo.luxtempo.example>'),
  UNIT_NAME: z.string().min(1).default('Marram Point Eye Unit'),
  /** The number patients call with a concern after treatment; printed on the discharge sheet. */
  UNIT_PHONE: z.string().min(3).max(40).default('+351 200 000 000 (demo number, not in service)'),
  UNIT_TIME_ZONE: z
    .string()
    .refine((zone) => {
      try {
        new Intl.DateTimeFormat('en', { timeZone: zone });
        return true;
      } catch {
        return false;
      }
    }, 'UNIT_TIME_ZONE must be an IANA time zone such as Europe/Lisbon')
    .default('Europe/Lisbon'),
  DEMO_DATA: bool.default(true),
  LOGIN_FAILURE_LIMIT: z.coerce.number().int().min(1).max(1000).default(10),
  LOGIN_FAILURE_WINDOW_MIN: z.coerce.number().int().min(1).max(1440).default(15),
  UPLOAD_DIR: z.string().min(1).default('.data/uploads'),
  /** How far ahead of the server a tablet's tap may be timed (its clock runs a little fast); further is refused. */
  TAP_CLOCK_SKEW_S: z.coerce.number().int().min(0).max(300).default(10),
  /** The oldest tap the unit accepts from a tablet's offline queue, in hours; older is refused. */
  TAP_OFFLINE_WINDOW_H: z.coerce.number().min(0.25).max(24).default(4),
});

export type Config = z.infer<typeof envSchema>;

/** Reads and checks the environment once; a bad setting stops the server with its name. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Luxtempo cannot start: the configuration is not valid.\n${lines.join('\n')}`);
  }
  return parsed.data;
}
