import { z } from 'zod';
import { roleSchema } from '../members/schema';

export const createInvitationSchema = z.strictObject({
  email: z.string().trim().toLowerCase().email('enter an e-mail address').max(254, 'use at most 254 characters'),
  role: roleSchema,
});
