import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type Options } from 'express-rate-limit';
import type { Config } from '../config';

/**
 * Failed sign-ins are limited per account and per network address: the (limit+1)th failure
 * inside the window is answered 429 with Retry-After. Successful sign-ins do not count.
 * The counters live in this process; behind several instances, give each the same limits and
 * accept that a guesser spread across instances gets a few more tries (see README).
 */
export function loginLimiters(config: Config): RequestHandler[] {
  const common = {
    windowMs: config.LOGIN_FAILURE_WINDOW_MIN * 60_000,
    limit: config.LOGIN_FAILURE_LIMIT,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: ((_req, res, _next, options) => {
      const retryAfterS = Math.ceil(options.windowMs / 1000);
      if (!res.getHeader('Retry-After')) res.setHeader('Retry-After', String(retryAfterS));
      res.status(429).json({
        error: {
          code: 'too_many_attempts',
          message: `Too many failed sign-ins. Wait ${Math.ceil(Number(res.getHeader('Retry-After')) / 60)} minutes and try again, or ask an administrator.`,
        },
      });
    }) satisfies Options['handler'],
  };
  const perAddress = rateLimit({ ...common, keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}` });
  const perAccount = rateLimit({
    ...common,
    keyGenerator: (req) => {
      const email = typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '';
      return `account:${email}`;
    },
  });
  return [perAddress, perAccount];
}
