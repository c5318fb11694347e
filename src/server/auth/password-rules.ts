/**
 * What a new password must satisfy: 12 to 128 characters (counted as Unicode code points, never
 * truncated), any characters, no composition rules, not one of the 1,000 most common passwords.
 * OWASP ASVS 5.0 V6.2.1 (minimum length), V6.2.9 (at least 64 allowed), V6.2.4 (common passwords refused),
 * V6.2.5 (no composition rules), V6.2.8 (checked exactly as typed, no truncation).
 */
import commonPasswordsText from './common-passwords.txt?raw';

export const PASSWORD_MIN_CHARS = 12;
export const PASSWORD_MAX_CHARS = 128;

const COMMON_PASSWORDS: ReadonlySet<string> = new Set(
  commonPasswordsText
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l && !l.startsWith('#')),
);

export function commonPasswordCount(): number {
  return COMMON_PASSWORDS.size;
}

/** A sentence saying what is wrong with a proposed password, or null when it is acceptable. */
export function passwordProblem(password: string): string | null {
  const chars = [...password].length;
  if (chars < PASSWORD_MIN_CHARS) return `Use at least ${PASSWORD_MIN_CHARS} characters (this has ${chars}).`;
  if (chars > PASSWORD_MAX_CHARS) return `Use at most ${PASSWORD_MAX_CHARS} characters (this has ${chars}).`;
  if (COMMON_PASSWORDS.has(password.toLowerCase())) return 'This is one of the most common passwords; choose another.';
  return null;
}
