import type { FieldErrors } from '../../lib/serverIssues';

export interface SignInValues {
  email: string;
  password: string;
}

// The shared login schema's rules and words, checked by hand so that the sign-in page does not load zod
// before anyone has signed in. The server checks the same schema; signInChecks.test.ts keeps the two in step.
const EMAIL = /^(?:[A-Za-z0-9_'+\-]+\.)*[A-Za-z0-9_'+\-]*[A-Za-z0-9_+-]@(?:[A-Za-z0-9][A-Za-z0-9\-]*\.)+[A-Za-z]{2,}$/;

function emailIssue(raw: string): string | null {
  const email = raw.trim().toLowerCase();
  if (email.length > 254) return 'At most 254 characters.';
  if (/[\r\n]/.test(email)) return 'Must be a single line.';
  if (!EMAIL.test(email)) return 'Enter a valid e-mail address.';
  return null;
}

function passwordIssue(password: string): string | null {
  if (password.length < 1) return 'Required.';
  if (password.length > 1024) return 'Too long.';
  return null;
}

/** The message each field shows before anything is sent; no key for a field that is fine. */
export function signInIssues(values: SignInValues): FieldErrors {
  const issues: FieldErrors = {};
  const email = emailIssue(values.email);
  const password = passwordIssue(values.password);
  if (email) issues.email = email;
  if (password) issues.password = password;
  return issues;
}
