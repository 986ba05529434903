import { z } from 'zod';

export const requestResetSchema = z.strictObject({
  email: z.string().trim().toLowerCase().email('enter an e-mail address').max(254, 'use at most 254 characters'),
});

export const completeResetSchema = z.strictObject({
  password: z.string().min(10, 'use at least 10 characters').max(200, 'use at most 200 characters'),
});

export const resetTokenSchema = z.string().min(20, 'This link is not valid.').max(100, 'This link is not valid.');
