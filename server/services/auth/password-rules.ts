import { isCommonPassword } from '../../auth/common-passwords';
import { normaliseEmail } from '../../db/people';
import { AppError } from '../../errors';

/** The rules a new password follows, at sign-up and at a reset (length is checked by the route's schema). */
export function checkNewPassword(password: string, email: string): void {
  if (isCommonPassword(password)) {
    throw new AppError('password_too_common', 'This password is too common', 'invalid', {
      password: 'This password is one of the most common ones and easy to guess: choose another',
    });
  }
  if (password.toLowerCase().includes(normaliseEmail(email).split('@')[0] ?? '\u0000')) {
    throw new AppError('password_contains_email', 'The password contains the e-mail address', 'invalid', {
      password: 'The password must not contain your e-mail address',
    });
  }
}
