import { z } from 'zod';

export const PASSWORD_MIN = 10;

export const signUpSchema = z.strictObject({
  email: z.string().trim().max(254).email('enter a valid e-mail address, such as name@example.org'),
  password: z
    .string()
    .min(PASSWORD_MIN, `use at least ${PASSWORD_MIN} characters`)
    .max(200, 'use at most 200 characters'),
  name: z.string().trim().min(1, 'enter your name').max(120, 'use at most 120 characters'),
});
export type SignUpInput = z.infer<typeof signUpSchema>;
