import type { FormErrors } from '@mantine/form';

/** The typed-twice check, which only the form needs: the server sees one password. */
export function passwordsMatch<Values extends { confirmPassword: string }>(field: keyof Values & string) {
  return (values: Values): FormErrors =>
    values[field] === values.confirmPassword ? {} : { confirmPassword: 'The two passwords are not the same.' };
}
