import { z } from 'zod';
import { safeText } from '@/lib/engine/text';

export const PASSWORD_MIN = 10;
/** bcrypt reads only the first 72 bytes of a password; a longer one is refused rather than cut silently. */
export const PASSWORD_MAX_BYTES = 72;

export const passwordSchema = z
  .string()
  .min(PASSWORD_MIN, `use at least ${PASSWORD_MIN} characters`)
  .refine((value) => new TextEncoder().encode(value).length <= PASSWORD_MAX_BYTES, {
    message: `use at most ${PASSWORD_MAX_BYTES} bytes (about ${PASSWORD_MAX_BYTES} plain letters)`,
  });

export const signUpSchema = z.strictObject({
  email: z.string().trim().max(254).email('enter a valid e-mail address, such as name@example.org'),
  password: passwordSchema,
  name: safeText().trim().min(1, 'enter your name').max(120, 'use at most 120 characters'),
});
export type SignUpInput = z.infer<typeof signUpSchema>;
