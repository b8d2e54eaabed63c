/**
 * Why the server ended the session (idle too long, signed out elsewhere, ended by an
 * administrator), kept for this tab until the sign-in page has said it once.
 */
const key = 'luxtempo.session-ended';

export function rememberWhySessionEnded(message: string): void {
  try {
    sessionStorage.setItem(key, message);
  } catch {
    // Only the explanation is lost.
  }
}

export function readWhySessionEnded(): string | null {
  try {
    return sessionStorage.getItem(key);
  } catch {
    return null;
  }
}

export function forgetWhySessionEnded(): void {
  try {
    sessionStorage.removeItem(key);
  } catch {
    // Nothing kept.
  }
}
