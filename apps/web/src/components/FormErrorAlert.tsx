import { Alert } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';

/** The banner of the form recipe: what the server said that no single field can show. */
export function FormErrorAlert({ message }: { message: string | null }) {
  if (!message) return null;
  return (
    <Alert color="red" icon={<IconAlertTriangle />} role="alert" data-testid="form-error">
      {message}
    </Alert>
  );
}
