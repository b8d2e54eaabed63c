import { z } from 'zod';

const bool = z.enum(['true', 'false']).transform((v) => v === 'true');
const port = z.coerce.number().int().min(1).max(65535);

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(3000),
  DB_HOST: z.string().min(1).default('127.0.0.1'),
  DB_PORT: port.default(3307),
  DB_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_]+$/, 'DB_NAME may hold letters, digits and _ only')
    .default('luxtempo'),
  DB_USER: z.string().min(1).default('luxtempo_app'),
  DB_PASSWORD: z.string().min(1, 'DB_PASSWORD is required'),
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters'),
  /** A session's maximum lifetime, however active it is. */
  SESSION_HOURS: z.coerce.number().min(1).max(24).default(12),
  /** A session with no call for this long ends (a shared ward tablet left signed in). */
  SESSION_IDLE_MIN: z.coerce
    .number()
    .int()
    .min(1, 'SESSION_IDLE_MIN must be 1 to 720 minutes')
    .max(720, 'SESSION_IDLE_MIN must be 1 to 720 minutes')
    .default(30),
  /** How long an e-mailed link to set a password works. */
  PASSWORD_LINK_HOURS: z.coerce
    .number()
    .min(0.25, 'PASSWORD_LINK_HOURS must be 0.25 to 168')
    .max(168, 'PASSWORD_LINK_HOURS must be 0.25 to 168')
    .default(24),
  /** The address people open Luxtempo at, for links in e-mails; `http://HOST:PORT` when unset. */
  PUBLIC_URL: z
    .string()
    .url('PUBLIC_URL must be a full address such as https://luxtempo.example.org')
    .optional(),
  COOKIE_SECURE: bool.default(false),
  /**
   * Which proxies' X-Forwarded-For to believe (Express `trust proxy`): off by default, so the
   * address throttled is the one that connected. Set it to the proxy's address or subnet, or a
   * hop count; `true` (believe anyone) is refused, since any client could then pick its address.
   */
  TRUST_PROXY: z
    .string()
    .default('false')
    .refine(
      (v) => v.trim() !== 'true',
      'TRUST_PROXY=true would let any client choose its address; name the proxy (an address, subnet, "loopback") or a hop count',
    )
    .transform((v): false | number | string =>
      v.trim() === '' || v.trim() === 'false'
        ? false
        : /^\d+$/.test(v.trim())
          ? Number(v.trim())
          : v.trim(),
    ),
  /**
   * Whether one verteporfin vial may serve more than one patient on a list (aseptic preparation,
   * every dose within the vial's beyond-use time). Off unless the unit's written policy allows it.
   */
  VIAL_SHARING_ALLOWED: bool.default(false),
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
  /**
   * The unit's locale (a BCP 47 tag): how dates are entered and shown on every screen and sheet,
   * whatever the browser's own setting. en-GB, the demo unit's, reads day/month/year.
   */
  UNIT_LOCALE: z
    .string()
    .refine((locale) => {
      try {
        return Intl.DateTimeFormat.supportedLocalesOf([locale]).length === 1;
      } catch {
        return false;
      }
    }, 'UNIT_LOCALE must be a locale tag such as en-GB')
    .default('en-GB'),
  /**
   * A new order's weight that differs from the patient's last recorded weight by more than this
   * percentage, the last one less than WEIGHT_CHANGE_WITHIN_DAYS old, needs a reason to be signed
   * (demo defaults 10 % and 90 days: common practice, no single source).
   */
  WEIGHT_CHANGE_MAX_PCT: z.coerce
    .number()
    .positive('WEIGHT_CHANGE_MAX_PCT must be above 0')
    .max(100, 'WEIGHT_CHANGE_MAX_PCT must be at most 100')
    .default(10),
  WEIGHT_CHANGE_WITHIN_DAYS: z.coerce
    .number()
    .int('WEIGHT_CHANGE_WITHIN_DAYS must be a whole number')
    .min(1, 'WEIGHT_CHANGE_WITHIN_DAYS must be 1 to 3650')
    .max(3650, 'WEIGHT_CHANGE_WITHIN_DAYS must be 1 to 3650')
    .default(90),
  /**
   * The hospital's FHIR R4 server (base URL, e.g. http://127.0.0.1:3090). Unset: no patient look-up
   * and no treatment records sent; the screens hide both.
   */
  FHIR_BASE_URL: z
    .string()
    .url('FHIR_BASE_URL must be a full address such as https://fhir.hospital.example/r4')
    .transform((v) => v.replace(/\/+$/, ''))
    .optional()
    .or(z.literal('').transform(() => undefined)),
  /** How long one request to the FHIR server may take before it counts as down. */
  FHIR_TIMEOUT_MS: z.coerce.number().int().min(500).max(60000).default(5000),
  /** Fictitious demo people (with a published password) and patients; never wanted in production. */
  DEMO_DATA: bool.optional(),
  LOGIN_FAILURE_LIMIT: z.coerce.number().int().min(1).max(1000).default(10),
  LOGIN_FAILURE_WINDOW_MIN: z.coerce.number().int().min(1).max(1440).default(15),
  UPLOAD_DIR: z.string().min(1).default('.data/uploads'),
  /** How far ahead of the server a tablet's tap may be timed (its clock runs a little fast); further is refused. */
  TAP_CLOCK_SKEW_S: z.coerce.number().int().min(0).max(300).default(10),
  /** The oldest tap the unit accepts from a tablet's offline queue, in hours; older is refused. */
  TAP_OFFLINE_WINDOW_H: z.coerce.number().min(0.25).max(24).default(4),
  /**
   * How long a device's output check lets it start sessions: unset, the unit's calendar day it was
   * made on; a number, that many hours.
   */
  OUTPUT_CHECK_VALID_H: z.coerce
    .number()
    .min(1, 'OUTPUT_CHECK_VALID_H must be 1 to 168 hours')
    .max(168, 'OUTPUT_CHECK_VALID_H must be 1 to 168 hours')
    .optional(),
});

export type Config = Omit<z.infer<typeof envSchema>, 'DEMO_DATA'> & { DEMO_DATA: boolean };

/** Reads and checks the environment once; a bad setting stops the server with its name. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Luxtempo cannot start: the configuration is not valid.\n${lines.join('\n')}`);
  }
  // Demo people have a published password: on unless told otherwise, except in production.
  return {
    ...parsed.data,
    DEMO_DATA: parsed.data.DEMO_DATA ?? parsed.data.NODE_ENV !== 'production',
  };
}
