import type { ReactNode } from 'react';
import { Alert, Button, Checkbox, Group, Paper, SegmentedControl, Select, SimpleGrid, Stack, Text, TextInput, Textarea, Title } from '@mantine/core';
import type { UseFormReturnType } from '@mantine/form';
import { fieldCreateSchema, fieldUpdateSchema, FIELD_KINDS, type FieldDto, type FieldKind } from '@hitchbook/shared/schemas/fields';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { formatDecimal } from '../../../lib/money';
import { useCreateField } from '../api/createField';
import { useLandowners } from '../api/listLandowners';
import { useUpdateField } from '../api/updateField';
import { fieldCreatePayload, fieldFormValues, fieldUpdatePayload, stripAcresPreview, type FieldFormValues } from '../fieldForm';
import { FIELD_KIND_LABELS } from '../labels';
import { BoundaryUpload } from './BoundaryUpload';

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Paper withBorder p="md" radius="md">
      <Stack gap="md">
        <Title order={2} size="h4">
          {title}
        </Title>
        {children}
      </Stack>
    </Paper>
  );
}

interface FieldFieldsProps {
  form: UseFormReturnType<FieldFormValues>;
  field: FieldDto | null;
  formError: string | null;
  submitting: boolean;
  onCancel: () => void;
}

function FieldFields({ form, field, formError, submitting, onCancel }: FieldFieldsProps) {
  const landowners = useLandowners();
  const values = form.getValues();
  const roadside = values.kind === 'roadside';
  const strip = roadside ? stripAcresPreview(values.lengthMiles, values.widthFt) : null;

  return (
    <Stack gap="lg" maw={860}>
      <FormErrorAlert message={formError} />
      <Section title={roadside ? 'The road stretch' : 'The field'}>
        {field === null && (
          <SegmentedControl
            fullWidth
            data={FIELD_KINDS.map((k) => ({ value: k, label: FIELD_KIND_LABELS[k] }))}
            {...form.getInputProps('kind')}
          />
        )}
        <TextInput
          label="Name"
          withAsterisk
          description={roadside ? 'For example “County Road 9, north ditch”.' : undefined}
          {...form.getInputProps('name')}
        />
        {roadside ? (
          <>
            <TextInput label="Road" withAsterisk {...form.getInputProps('roadName')} />
            <SimpleGrid cols={{ base: 1, sm: 2 }}>
              <TextInput label="From" description="A crossroad or landmark." {...form.getInputProps('roadFrom')} />
              <TextInput label="To" {...form.getInputProps('roadTo')} />
              <DecimalInput label="Length" unit="miles" withAsterisk {...form.getInputProps('lengthMiles')} />
              <DecimalInput label="Mowing width" unit="ft" withAsterisk description="Across the ditch and shoulder." {...form.getInputProps('widthFt')} />
            </SimpleGrid>
            <Text fw={700} data-testid="strip-acres">
              {strip ? `${formatDecimal(strip, 2)} acres (length × width)` : 'Acres follow from the length and width.'}
            </Text>
          </>
        ) : (
          <DecimalInput label="Acres" unit="ac" withAsterisk description="The acres you farm or bill by." {...form.getInputProps('acres')} />
        )}
        <SimpleGrid cols={{ base: 1, sm: 2 }}>
          <Select
            label={roadside ? 'Road authority or owner' : 'Landlord or owner'}
            placeholder="Nobody named"
            clearable
            searchable
            data={(landowners.data ?? []).map((p) => ({ value: p.id, label: p.name }))}
            {...form.getInputProps('ownerPartyId')}
          />
          <TextInput label="Farm or section" description="For example “Home place” or “Sec. 14”." {...form.getInputProps('farmLabel')} />
        </SimpleGrid>
      </Section>
      <Section title="Boundary">
        {field?.hasBoundary && !values.removeBoundary && (
          <Alert color="slate" variant="light" data-testid="boundary-acres">
            The stored boundary measures {field.boundaryAcres ? formatDecimal(field.boundaryAcres, 2) : '—'} acres; {formatDecimal(field.acres, 2)} acres are
            entered.
          </Alert>
        )}
        <BoundaryUpload
          error={form.errors.boundaryUploadId}
          onUploaded={(upload) => form.setFieldValue('boundaryUploadId', upload?.id ?? '')}
        />
        {field?.hasBoundary && (
          <Checkbox label="Remove the stored boundary" size="md" {...form.getInputProps('removeBoundary', { type: 'checkbox' })} />
        )}
      </Section>
      <Textarea label="Notes" autosize minRows={2} {...form.getInputProps('notes')} />
      <Group justify="flex-end">
        <Button variant="default" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" loading={submitting}>
          {field ? 'Save changes' : roadside ? 'Add road stretch' : 'Add field'}
        </Button>
      </Group>
    </Stack>
  );
}

interface CreateFieldFormProps {
  kind: FieldKind;
  onSaved: (field: FieldDto) => void;
  onCancel: () => void;
}

export function CreateFieldForm({ kind, onSaved, onCancel }: CreateFieldFormProps) {
  const create = useCreateField();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: fieldCreateSchema,
    initialValues: fieldFormValues(null, kind),
    toPayload: fieldCreatePayload,
    mutation: create,
    onSuccess: onSaved,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <FieldFields form={form} field={null} formError={formError} submitting={submitting} onCancel={onCancel} />
    </form>
  );
}

interface EditFieldFormProps {
  field: FieldDto;
  onSaved: (field: FieldDto) => void;
  onCancel: () => void;
}

export function EditFieldForm({ field, onSaved, onCancel }: EditFieldFormProps) {
  const update = useUpdateField(field.id);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: fieldUpdateSchema,
    initialValues: fieldFormValues(field),
    toPayload: fieldUpdatePayload,
    mutation: update,
    onSuccess: onSaved,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <FieldFields form={form} field={field} formError={formError} submitting={submitting} onCancel={onCancel} />
    </form>
  );
}
