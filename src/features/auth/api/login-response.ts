import { z } from 'zod';
import { sessionUserSchema } from '../../../../shared/schemas/auth';

/** The sign-in answer (loaded with the request by ./log-in.ts, not with the sign-in page). */
export const loginResponseSchema = z.object({ user: sessionUserSchema });
