import { GyreException } from '../common/errors/gyre.exception';
import { assertPasswordAcceptable } from './password-policy';

const reasonFor = (password: string, email?: string): string | null => {
  try {
    assertPasswordAcceptable(password, { field: 'newPassword', email });
    return null;
  } catch (error) {
    if (!(error instanceof GyreException)) throw error;
    return error.message;
  }
};

describe('password policy (length and common passwords, NIST SP 800-63B 5.1.1.2)', () => {
  it('accepts a long uncommon passphrase', () => {
    expect(reasonFor('amber-slate-42-rhythm')).toBeNull();
  });

  it('refuses fewer than 12 characters, counting code points not bytes', () => {
    expect(reasonFor('abcdefghijk')).toMatch(/^newPassword: has 11 characters; at least 12/);
    expect(reasonFor('ääääääääääbc')).toBeNull();
    expect(reasonFor('äääääääääb')).toMatch(/has 10 characters/);
  });

  it('refuses more than 72 bytes, the part bcrypt reads', () => {
    expect(reasonFor('x1'.repeat(37))).toMatch(/72 bytes/);
  });

  it('refuses common passwords whatever their case', () => {
    expect(reasonFor('Password1234')).toMatch(/commonly used/);
    expect(reasonFor('QWERTY123456')).toMatch(/commonly used/);
  });

  it('refuses one repeated character and the e-mail itself', () => {
    expect(reasonFor('aaaaaaaaaaaaaaa')).toMatch(/repeats/);
    expect(reasonFor('dana.analyst-2026', 'dana.analyst@example.org')).toMatch(/e-mail/);
  });
});
