import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import bcrypt from 'bcryptjs';
import { AppError } from '../http/app-error';

/** bcrypt cost 2^11: about 0.15 s per hash in pure-JS bcrypt here — slow for a guesser, fine for a person. */
export const passwordHashCost = 11;

/**
 * bcrypt reads only the first 72 bytes of what it is given, so two long passwords sharing those
 * bytes would both match. Current hashes are bcrypt over the base64 SHA-256 of the whole
 * password (44 bytes, never a NUL), marked with this prefix; hashes without it are the older
 * plain bcrypt, still accepted and rewritten the next time the person signs in.
 */
const currentFormat = 'sha256-bcrypt$';

function prehash(password: string): string {
  return createHash('sha256').update(password, 'utf8').digest('base64');
}

export async function hashPassword(password: string, cost = passwordHashCost): Promise<string> {
  return currentFormat + (await bcrypt.hash(prehash(password), cost));
}

/** A stored value that matches no password: an account whose person has not set one yet. */
export const noPasswordYet = '!unset';

export interface PasswordCheck {
  matches: boolean;
  /** The stored hash is in an older format; store a fresh one now that we know the password. */
  needsUpgrade: boolean;
}

// Compared against when there is no usable hash, so every failure takes about the same time.
const decoyHash = bcrypt.hashSync('luxtempo-no-such-person', passwordHashCost);

export async function verifyPassword(
  password: string,
  stored: string | null | undefined,
): Promise<PasswordCheck> {
  if (stored?.startsWith(currentFormat)) {
    return {
      matches: await bcrypt.compare(prehash(password), stored.slice(currentFormat.length)),
      needsUpgrade: false,
    };
  }
  if (stored && /^\$2[aby]\$/.test(stored)) {
    return { matches: await bcrypt.compare(password, stored), needsUpgrade: true };
  }
  await bcrypt.compare(password, decoyHash);
  return { matches: false, needsUpgrade: false };
}

export const minimumPasswordLength = 12;
export const passwordMaxLength = 200;

const require = createRequire(import.meta.url);
let commonList: { test(password: string): boolean } | undefined;

/**
 * Mozilla's list of common passwords (`fxa-common-password-list`, pinned), decoded on first use.
 * The same password in other capitals is as easy to guess, so both are tried.
 */
export function isCommonPassword(password: string): boolean {
  commonList ??= require('fxa-common-password-list') as { test(password: string): boolean };
  return commonList.test(password) || commonList.test(password.toLowerCase());
}

/** The rules a new password must meet; the problem names the field it was given in. */
export function checkNewPassword(
  password: string,
  field: string,
  person?: { email: string },
): void {
  const problem =
    [...password].length < minimumPasswordLength
      ? `${field} must be at least ${minimumPasswordLength} characters`
      : [...password].length > passwordMaxLength
        ? `${field} must be at most ${passwordMaxLength} characters`
        : isCommonPassword(password)
          ? `${field} is on a list of commonly used passwords; choose another`
          : person && password.trim().toLowerCase() === person.email.trim().toLowerCase()
            ? `${field} must not be your e-mail address`
            : null;
  if (problem)
    throw AppError.badRequest('The new password does not meet the rules.', [
      { path: field, message: problem },
    ]);
}
