import { z } from 'zod';
import { passwordSchema } from '../users/schema';

export const requestResetSchema = z.strictObject({
  email: z.string().trim().toLowerCase().email('enter an e-mail address').max(254, 'use at most 254 characters'),
});

export const completeResetSchema = z.strictObject({
  password: passwordSchema,
});

export const resetTokenSchema = z.string().min(20, 'This link is not valid.').max(100, 'This link is not valid.');
