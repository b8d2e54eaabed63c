import type { Request, RequestHandler, Response, Router } from 'express';
import type { Capability } from '../../shared/roles';

/** Who may call a route: anyone, any signed-in person, or holders of one capability. */
export type Access = 'public' | 'signed-in' | Capability;

export interface RouteSpec {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** Path under /api, e.g. `/people/:id`. */
  path: string;
  access: Access;
  /** Runs after the access check and before the handler (a rate limiter, an upload parser…). */
  before?: RequestHandler[];
  handler: (req: Request, res: Response) => unknown;
}

export interface AccessGuards {
  signIn: RequestHandler;
  capability: (capability: Capability) => RequestHandler;
}

/**
 * Mounts routes with their access checks. Every route is declared with its access in one list;
 * the app keeps that list (`app.locals.routeTable`) so tests can walk all of it.
 */
export function mountRoutes(router: Router, specs: RouteSpec[], guards: AccessGuards): void {
  for (const spec of specs) {
    const checks: RequestHandler[] = [];
    if (spec.access !== 'public') checks.push(guards.signIn);
    if (spec.access !== 'public' && spec.access !== 'signed-in')
      checks.push(guards.capability(spec.access));
    // Express 5 passes a rejected promise from a handler on to the error middleware.
    router[spec.method](
      spec.path,
      ...checks,
      ...(spec.before ?? []),
      spec.handler as RequestHandler,
    );
  }
}
