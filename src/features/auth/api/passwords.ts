import { z } from 'zod';
import {
  passwordLinkInfoSchema,
  type ChangePassword,
  type PasswordLinkInfo,
  type SetPassword,
} from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';

/** The signed-in person's own change; a wrong current password answers 400, not "session ended". */
export async function changePassword(input: ChangePassword): Promise<void> {
  await api.post<void>('/auth/password', input);
}

export async function checkPasswordLink(
  token: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PasswordLinkInfo> {
  const { link } = await api.post(
    '/auth/password-link/check',
    { token },
    { schema: z.object({ link: passwordLinkInfoSchema }), signal, unauthorized: 'report' },
  );
  return link;
}

export async function setPasswordWithLink(input: SetPassword): Promise<void> {
  await api.post<void>('/auth/password-link', input, { unauthorized: 'report' });
}
