import { Alert } from '@mantine/core';
import { IconInfoCircle } from '@tabler/icons-react';

/** Every estimate screen says what its figures are and are not. */
export function EstimateNotice() {
  return (
    <Alert color="slate" variant="light" icon={<IconInfoCircle />} data-testid="estimate-notice">
      These figures are estimates for planning, not tax, legal or accounting advice. Check them against your own
      records and talk to your accountant before relying on them.
    </Alert>
  );
}
