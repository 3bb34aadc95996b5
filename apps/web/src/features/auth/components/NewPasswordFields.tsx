import { PasswordInput } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';

interface NewPasswordFieldsProps<Values extends { confirmPassword: string }> {
  form: UseFormReturnType<Values>;
  passwordField: keyof Values & string;
  label?: string;
}

export function NewPasswordFields<Values extends { confirmPassword: string }>({
  form,
  passwordField,
  label = 'New password',
}: NewPasswordFieldsProps<Values>) {
  return (
    <>
      <PasswordInput
        label={label}
        description="At least 8 characters"
        autoComplete="new-password"
        {...form.getInputProps(passwordField)}
      />
      <PasswordInput
        label={`${label}, again`}
        autoComplete="new-password"
        {...form.getInputProps('confirmPassword')}
      />
    </>
  );
}
