/**
 * Every route in the client. Screens link with `getHref(...)`; the router matches on `path`.
 * Nothing else in the app writes a URL by hand.
 */
export const paths = {
  signIn: {
    path: '/sign-in',
    /** `redirectTo` is where the person was heading; they land there after signing in. */
    getHref: (redirectTo?: string | null) =>
      redirectTo && redirectTo !== '/' ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in',
  },
  today: {
    path: '/',
    getHref: () => '/',
  },
  people: {
    path: '/people',
    getHref: () => '/people',
  },
  protocols: {
    path: '/protocols',
    getHref: () => '/protocols',
  },
  protocolVersion: {
    path: '/protocols/:key/v/:version',
    getHref: (key: string, version: number | string) =>
      `/protocols/${encodeURIComponent(key)}/v/${encodeURIComponent(String(version))}`,
  },
  lightCalculator: {
    path: '/light-calculator',
    getHref: () => '/light-calculator',
  },
} as const;
