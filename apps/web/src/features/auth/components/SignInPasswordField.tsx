import { useState } from 'react';
import { TextInput, UnstyledButton, type TextInputProps } from '@mantine/core';

// The sign-in page's password box: a text input whose button shows the password, because Mantine's password
// input brings its action-icon family to the first page everyone loads. It keeps that input's look and adds
// what a sighted keyboard user and a screen reader need: a named toggle button that says whether it is on.
function EyeIcon({ crossed }: { crossed: boolean }) {
  return (
    <svg width="20" height="20" viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" aria-hidden="true">
      <path d="M2 12s3.6-7 10-7 10 7 10 7-3.6 7-10 7S2 12 2 12z" />
      <circle cx="12" cy="12" r="3" />
      {crossed && <path d="M4 4l16 16" />}
    </svg>
  );
}

export function SignInPasswordField(props: Omit<TextInputProps, 'type' | 'rightSection'>) {
  const [visible, setVisible] = useState(false);
  return (
    <TextInput
      {...props}
      type={visible ? 'text' : 'password'}
      rightSection={
        <UnstyledButton
          type="button"
          aria-label="Show password"
          aria-pressed={visible}
          onClick={() => setVisible((shown) => !shown)}
          c="dimmed"
          style={{ display: 'flex', padding: 4, borderRadius: 'var(--mantine-radius-sm)' }}
        >
          <EyeIcon crossed={visible} />
        </UnstyledButton>
      }
    />
  );
}
