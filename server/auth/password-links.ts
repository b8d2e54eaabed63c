import { createHash, randomBytes } from 'node:crypto';
import type { Config } from '../config';
import type { PasswordLinkPurpose } from '../db/entities/password-link';
import type { Transaction, UnitOfWork } from '../db/unit-of-work';
import { enqueueMessage } from '../mail/outbox-repository';
import type { PasswordLinkRepository } from './password-link-repository';

export const hashLinkToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** The client's page that reads the token from the address's fragment (never sent to a server or a log). */
export const setPasswordPath = '/set-password';

export function publicUrl(config: Pick<Config, 'PUBLIC_URL' | 'HOST' | 'PORT'>): string {
  return (config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`).replace(/\/+$/, '');
}

/** Makes one-time links to set a password and e-mails them through the outbox. */
export function createPasswordLinks(
  unitOfWork: UnitOfWork,
  links: PasswordLinkRepository,
  config: Config,
) {
  const lifetimeS = config.PASSWORD_LINK_HOURS * 3600;
  const hoursText = Number.isInteger(config.PASSWORD_LINK_HOURS)
    ? `${config.PASSWORD_LINK_HOURS} hours`
    : `${Math.round(lifetimeS / 60)} minutes`;

  async function issue(
    tx: Transaction,
    person: { id: number },
    purpose: PasswordLinkPurpose,
    createdBy: number | null,
  ): Promise<string> {
    const token = randomBytes(32).toString('base64url');
    await links.insert(tx, {
      tokenHash: hashLinkToken(token),
      userId: person.id,
      purpose,
      createdBy,
      lifetimeS,
    });
    return token;
  }

  const urlOf = (token: string) => `${publicUrl(config)}${setPasswordPath}#${token}`;

  return {
    lifetimeS,
    urlOf,
    /** For the command that creates the first admin: the link is printed, not mailed. */
    async issueForPrinting(person: { id: number }): Promise<string> {
      return urlOf(await unitOfWork((tx) => issue(tx, person, 'new-account', null)));
    },
    /** Writes the link and its e-mail in one transaction: both or neither. */
    async send(
      person: { id: number; email: string; displayName: string },
      purpose: PasswordLinkPurpose,
      createdBy: number,
    ): Promise<void> {
      await unitOfWork(async (tx) => {
        const token = await issue(tx, person, purpose, createdBy);
        const opening =
          purpose === 'new-account'
            ? `An account has been made for you on Luxtempo (${config.UNIT_NAME}).`
            : `An administrator has asked for you to set a new Luxtempo password (${config.UNIT_NAME}).`;
        await enqueueMessage(tx, {
          kind: 'password-link',
          recipients: [person.email],
          subject:
            purpose === 'new-account'
              ? 'Your Luxtempo account: set your password'
              : 'Luxtempo: set a new password',
          body: [
            `Hello ${person.displayName},`,
            '',
            opening,
            `Open this link to set your password. It works once, for ${hoursText}:`,
            '',
            urlOf(token),
            '',
            'If you did not expect this message, do not open the link; tell your administrator.',
          ].join('\n'),
          related: { type: 'user', id: person.id },
        });
      });
    },
  };
}

export type PasswordLinks = ReturnType<typeof createPasswordLinks>;
