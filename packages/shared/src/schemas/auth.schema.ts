import { z } from 'zod';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters')
  .pipe(z.email({ message: 'Enter a valid e-mail address' }));

/** ASVS 6.2.1 / 6.2.9: at least 8 characters, and long passphrases allowed. Common ones are refused on the server. */
export const passwordSchema = z
  .string()
  .min(8, 'Use at least 8 characters')
  .max(128, 'Use at most 128 characters');

export const signInSchema = z.strictObject({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(128, 'Use at most 128 characters'),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });
export type PasswordResetRequestInput = z.infer<typeof passwordResetRequestSchema>;

export const setPasswordSchema = z.strictObject({
  token: z.string().min(20, 'This link is not valid').max(200, 'This link is not valid'),
  password: passwordSchema,
});
export type SetPasswordInput = z.infer<typeof setPasswordSchema>;
