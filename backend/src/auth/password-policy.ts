import { PASSWORD_MAX_BYTES, PASSWORD_MIN_LENGTH } from '@gyre/shared';
import { AuthError, authError } from './auth.errors';
import { COMMON_PASSWORDS } from './common-passwords';

/**
 * Length first, then a check against commonly used passwords (NIST SP 800-63B §5.1.1.2
 * asks for both; no composition rules). Throws with the field named and the reason.
 */
export function assertPasswordAcceptable(
  password: string,
  context: { field: string; email?: string },
): void {
  const refuse = (reason: string): never => {
    throw authError(AuthError.PasswordTooWeak, `${context.field}: ${reason}`, {
      field: context.field,
      reason,
    });
  };
  const length = [...password].length;
  if (length < PASSWORD_MIN_LENGTH) {
    refuse(`has ${length} characters; at least ${PASSWORD_MIN_LENGTH} are needed`);
  }
  if (Buffer.byteLength(password, 'utf8') > PASSWORD_MAX_BYTES) {
    refuse(`is longer than ${PASSWORD_MAX_BYTES} bytes, the most a password hash can use`);
  }
  const lower = password.toLowerCase();
  if (COMMON_PASSWORDS.has(lower)) refuse('is on the list of commonly used passwords');
  if (new Set(lower).size <= 2) refuse('repeats one or two characters only');
  const localPart = context.email?.split('@')[0]?.toLowerCase();
  if (localPart !== undefined && localPart.length >= 4 && lower.includes(localPart)) {
    refuse('contains the e-mail address');
  }
}
