/**
 * Where to go after signing in, taken from the address bar. Only paths inside this app are
 * accepted, so a crafted link cannot send someone to another site after they sign in.
 */
export function safeRedirectTarget(value: string | null | undefined): string | null {
  if (!value) return null;
  if (!value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return null;
  try {
    const url = new URL(value, 'http://luxtempo.invalid');
    if (url.origin !== 'http://luxtempo.invalid') return null;
    return `${url.pathname}${url.search}${url.hash}`;
  } catch {
    return null;
  }
}
