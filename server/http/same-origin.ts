import type { RequestHandler } from 'express';
import { AppError } from './app-error';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Defence against cross-site requests beside the SameSite=Strict cookie: a state-changing request
 * whose Origin (or, failing that, Referer) names another host is refused.
 */
export const sameOriginOnly: RequestHandler = (req, _res, next) => {
  if (safeMethods.has(req.method)) return next();
  const source = req.get('origin') ?? req.get('referer');
  if (!source) return next(); // Non-browser clients (tests, scripts) send neither.
  let host: string;
  try {
    host = new URL(source).host;
  } catch {
    return next(AppError.forbidden('This request came from an unknown page and was refused.'));
  }
  if (host !== req.get('host'))
    return next(AppError.forbidden('This request came from another site and was refused.'));
  next();
};
