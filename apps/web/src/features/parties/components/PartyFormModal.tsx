import { Button, Group, Modal, SegmentedControl, Select, Stack, Text, TextInput, Textarea } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { partySchema, RELATIONSHIPS, type PartyInput } from '@hitchbook/shared/schemas/users';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useCreateParty } from '../api/createParty';
import type { Party, PartyKind, Relationship } from '../api/listParties';
import { useUpdateParty } from '../api/updateParty';
import { KIND_LABELS, RELATIONSHIP_LABELS } from '../labels';

interface PartyFormValues {
  kind: PartyKind;
  name: string;
  relationship: Relationship;
  email: string;
  phone: string;
  address: string;
  notes: string;
}

/** Households are usually family and customers usually neighbours; the owner can pick otherwise. */
function usualRelationship(kind: PartyKind): Relationship {
  return kind === 'household' ? 'family' : 'neighbour';
}

function valuesFrom(party: Party | null, kind: PartyKind): PartyFormValues {
  return {
    kind: party?.kind ?? kind,
    name: party?.name ?? '',
    relationship: party?.relationship ?? usualRelationship(kind),
    email: party?.email ?? '',
    phone: party?.phone ?? '',
    address: party?.address ?? '',
    notes: party?.notes ?? '',
  };
}

function toPayload(values: PartyFormValues): PartyInput {
  const blankToNull = (s: string) => (s.trim() ? s : null);
  return {
    kind: values.kind,
    name: values.name,
    relationship: values.relationship,
    email: blankToNull(values.email),
    phone: blankToNull(values.phone),
    address: blankToNull(values.address),
    notes: blankToNull(values.notes),
  };
}

interface PartyFormProps {
  party: Party | null;
  defaultKind: PartyKind;
  onDone: () => void;
}

function PartyForm({ party, defaultKind, onDone }: PartyFormProps) {
  const create = useCreateParty();
  const update = useUpdateParty(party?.id ?? '');
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: partySchema,
    initialValues: valuesFrom(party, defaultKind),
    mutation: party ? update : create,
    toPayload,
    onSuccess: onDone,
  });

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Stack gap={4}>
          <Text size="sm" fw={600}>
            Kind
          </Text>
          <SegmentedControl
            fullWidth
            data={(['household', 'customer'] as const).map((k) => ({ value: k, label: KIND_LABELS[k] }))}
            {...form.getInputProps('kind')}
            onChange={(value) => {
              const kind = value as PartyKind;
              const { kind: before, relationship } = form.getValues();
              form.setFieldValue('kind', kind);
              // Follow the kind only while the relationship is still the usual one for the old kind.
              if (relationship === usualRelationship(before)) form.setFieldValue('relationship', usualRelationship(kind));
            }}
          />
          <Text size="xs" c="dimmed">
            A household is part of the family outfit and has a balance; a customer is billed.
          </Text>
        </Stack>
        <TextInput label="Name" autoFocus {...form.getInputProps('name')} />
        <Select
          label="Relationship"
          description="Decides which rate sheet prices this party's work."
          data={RELATIONSHIPS.map((r) => ({ value: r, label: RELATIONSHIP_LABELS[r] }))}
          allowDeselect={false}
          {...form.getInputProps('relationship')}
        />
        <TextInput label="E-mail" type="email" inputMode="email" {...form.getInputProps('email')} />
        <TextInput label="Phone" type="tel" inputMode="tel" {...form.getInputProps('phone')} />
        <Textarea label="Address" autosize minRows={2} {...form.getInputProps('address')} />
        <Textarea label="Notes" autosize minRows={2} {...form.getInputProps('notes')} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onDone}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            {party ? 'Save changes' : 'Add party'}
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

interface PartyFormModalProps {
  opened: boolean;
  party: Party | null;
  defaultKind: PartyKind;
  onClose: () => void;
}

export function PartyFormModal({ opened, party, defaultKind, onClose }: PartyFormModalProps) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal
      opened={opened}
      onClose={onClose}
      title={party ? `Edit ${party.name}` : 'Add a household or customer'}
      fullScreen={phone}
      size="lg"
    >
      {opened && <PartyForm key={party?.id ?? 'new'} party={party} defaultKind={defaultKind} onDone={onClose} />}
    </Modal>
  );
}
