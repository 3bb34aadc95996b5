import { describe, expect, it } from 'vitest';
import { loginSchema } from '@hitchbook/shared/schemas/auth';
import { signInIssues, type SignInValues } from './signInChecks';

/** What the shared schema says about the same input, first message per field, as the form would show it. */
function schemaIssues(values: SignInValues): Record<string, string> {
  const result = loginSchema.safeParse(values);
  const issues: Record<string, string> = {};
  if (result.success) return issues;
  for (const issue of result.error.issues) issues[String(issue.path[0])] ??= issue.message;
  return issues;
}

const CASES: SignInValues[] = [
  { email: '', password: '' },
  { email: 'ada@hill.example', password: 'x' },
  { email: '  Ada.Hill@Hill-Farm.Example ', password: 'correct horse' },
  { email: 'ada@hill', password: 'x' },
  { email: 'ada hill@hill.example', password: 'x' },
  { email: '.ada@hill.example', password: 'x' },
  { email: 'ada..hill@hill.example', password: 'x' },
  { email: 'ada@-hill.example', password: 'x' },
  { email: "o'neil+cab@hill.example", password: 'x' },
  { email: 'ada@hill.example\nbcc@other.example', password: 'x' },
  { email: `${'a'.repeat(250)}@hill.example`, password: 'x' },
  { email: 'ada@hill.example', password: 'p'.repeat(1024) },
  { email: 'ada@hill.example', password: 'p'.repeat(1025) },
  { email: 'not an address', password: '' },
];

describe('sign-in checks before sending', () => {
  it.each(CASES)('agree with the shared login schema for %j', (values) => {
    expect(signInIssues(values)).toEqual(schemaIssues(values));
  });

  it('name both fields of an empty form', () => {
    expect(signInIssues({ email: '', password: '' })).toEqual({
      email: 'Enter a valid e-mail address.',
      password: 'Required.',
    });
  });
});
