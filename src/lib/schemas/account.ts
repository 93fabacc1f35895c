/**
 * Account fields shared by the accept-invite page and Settings. Length rule: NIST SP 800-63B
 * §5.1.1 asks for at least 8 characters and no composition rules; we ask for 10.
 */
import { z } from 'zod';

export const PASSWORD_MIN = 10;

export const NewPassword = z
  .string({ error: 'Choose a password' })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`)
  .max(256, 'Use at most 256 characters');

export const DisplayName = z
  .string({ error: 'Enter your name' })
  .trim()
  .min(1, 'Enter your name')
  .max(120, 'Use at most 120 characters');

export { errorsOf } from './errors';
