import type React from 'react';
import { Select, Text } from '@mantine/core';
import { isRole, ROLES, type Role } from '@hitchbook/shared/roles';
import { ROLE_DESCRIPTIONS, ROLE_LABELS } from '../../../lib/roleLabels';
import { usePartyOptions } from '../api/listPartyOptions';

/** Which party a sign-in may be tied to: customers must be, owners and partners may be. */
export function partyKindFor(role: Role): 'household' | 'customer' | null {
  if (role === 'customer') return 'customer';
  if (role === 'owner' || role === 'partner') return 'household';
  return null;
}

interface RoleAndPartyFieldsProps {
  role: Role;
  roleError: React.ReactNode;
  partyId: string | null;
  partyError: React.ReactNode;
  /** A new role can need a different kind of party, so the party is cleared with it. */
  onChange: (change: { role: Role; partyId: string | null }) => void;
}

export function RoleAndPartyFields({ role, roleError, partyId, partyError, onChange }: RoleAndPartyFieldsProps) {
  const partyKind = partyKindFor(role);
  const options = usePartyOptions(partyKind ?? 'household', partyKind !== null);

  return (
    <>
      <Select
        label="Role"
        data={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
        allowDeselect={false}
        value={role}
        error={roleError}
        onChange={(value) => {
          if (isRole(value) && value !== role) onChange({ role: value, partyId: null });
        }}
      />
      <Text size="sm" c="dimmed" mt={-8}>
        {ROLE_DESCRIPTIONS[role]}
      </Text>
      {partyKind && (
        <Select
          label={partyKind === 'customer' ? 'Customer' : 'Household (optional)'}
          description={
            partyKind === 'customer'
              ? 'This sign-in sees only the invoices of this customer.'
              : 'The household whose balance this person looks after.'
          }
          placeholder={options.isPending ? 'Loading…' : 'Pick one'}
          data={options.data ?? []}
          searchable
          clearable={partyKind === 'household'}
          nothingFoundMessage={`No ${partyKind === 'customer' ? 'customers' : 'households'} yet: add one under Parties.`}
          value={partyId}
          error={partyError}
          onChange={(value) => onChange({ role, partyId: value })}
        />
      )}
    </>
  );
}
