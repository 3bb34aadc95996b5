import { Text } from '@mantine/core';

/** Names the published method and where its coefficients come from, as the page promises. */
export function MethodNote() {
  return (
    <Text size="sm" c="slate.8" data-testid="method-note">
      Method: <strong>ASABE D497.7 / EP496.3 as used in Iowa State Extension AgDM A3-29</strong> (Estimating Farm
      Machinery Costs). Remaining value uses the D497 square-root curve on list price; repairs use the accumulated
      repair curve RF1 × list × (hours/1000)^RF2; fuel is 0.044 gal (diesel), 0.060 (gasoline) or 0.072 (LPG) per
      PTO horsepower-hour. Per-acre figures use field capacity from AgDM A3-24: mph × width × efficiency ÷ 8.25.
    </Text>
  );
}
