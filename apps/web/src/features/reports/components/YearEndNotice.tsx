import { Alert, Text } from '@mantine/core';
import { IconInfoCircle } from '@tabler/icons-react';

/** The year-end page says what its figures are, and names the published method behind the estimates. */
export function YearEndNotice() {
  return (
    <Alert color="slate" variant="light" icon={<IconInfoCircle />} data-testid="estimate-notice">
      <Text size="sm">
        These figures are estimates for setting next year’s rates, not tax, legal or accounting advice. Check them against
        your own records and talk to your accountant before relying on them.
      </Text>
      <Text size="sm" mt={6} data-testid="method-note">
        Estimates follow <strong>ASABE D497.7 / EP496.3 as used in Iowa State Extension AgDM A3-29</strong> (Estimating
        Farm Machinery Costs), fed with each machine’s own record and the year’s logs; actual figures are the costs and
        hours logged in Hitchbook.
      </Text>
    </Alert>
  );
}
