import { zodResolver } from '@hookform/resolvers/zod';
import { passwordResetRequestSchema, setPasswordSchema, signInSchema } from '@burrowline/shared';

// Only ever imported dynamically (see load-validation.ts), so zod stays out of the signed-out first load.

export const signInResolver = zodResolver(signInSchema);

export const passwordResetRequestResolver = zodResolver(passwordResetRequestSchema);

export function checkNewPassword(value: string): true | string {
  const result = setPasswordSchema.shape.password.safeParse(value);
  return result.success || (result.error.issues[0]?.message ?? 'Choose another password');
}
