import { describe, expect, it } from 'vitest';
import { isCommonPassword } from '../../../../server/auth/common-passwords';

describe('common password list', () => {
  // Both rank near the top of SecLists' 10-million-password-list-top-1M, the list's source.
  it('refuses well-known passwords of ten or more characters, in any letter case', () => {
    expect(isCommonPassword('1234567890')).toBe(true);
    expect(isCommonPassword('QWERTYUIOP')).toBe(true);
  });

  it('lets an uncommon passphrase through', () => {
    expect(isCommonPassword('larkspur field transit dip')).toBe(false);
  });
});
