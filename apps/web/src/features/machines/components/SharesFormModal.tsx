import { Button, Group, Modal, Stack, TextInput } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { machineSharesPutSchema, type MachineOwnerDto, type MachineSharesPutInput } from '@hitchbook/shared/schemas/machines';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { localDateIso } from '../../../lib/localTime';
import { useHouseholds } from '../api/listHouseholds';
import { usePutMachineShares } from '../api/putMachineShares';
import { plainSharePct, type ShareLineValues } from '../shares';
import { SharesEditor } from './SharesEditor';

interface SharesFormValues {
  effectiveFrom: string;
  shares: ShareLineValues[];
}

function toPayload(values: SharesFormValues): MachineSharesPutInput {
  return { effectiveFrom: values.effectiveFrom, shares: values.shares.map((l) => ({ partyId: l.partyId, sharePct: l.sharePct.trim() })) };
}

function SharesForm({ machineId, current, onDone }: { machineId: string; current: readonly MachineOwnerDto[]; onDone: () => void }) {
  const households = useHouseholds();
  const put = usePutMachineShares(machineId);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: machineSharesPutSchema,
    initialValues: {
      effectiveFrom: localDateIso(),
      shares: current.length > 0 ? current.map((o) => ({ partyId: o.partyId, sharePct: plainSharePct(o.sharePct) })) : [{ partyId: '', sharePct: '100' }],
    },
    toPayload,
    mutation: put,
    onSuccess: onDone,
  });
  const values = form.getValues();
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <TextInput
          label="Effective from"
          description="The new shares count from this day; the old ones stay in the history."
          type="date"
          {...form.getInputProps('effectiveFrom')}
        />
        <SharesEditor form={form} path="shares" lines={values.shares} households={households.data ?? []} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onDone}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            Save shares
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

interface SharesFormModalProps {
  opened: boolean;
  machineId: string;
  current: readonly MachineOwnerDto[];
  onClose: () => void;
}

export function SharesFormModal({ opened, machineId, current, onClose }: SharesFormModalProps) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onClose} title="Change the owners" size="lg" fullScreen={phone}>
      {opened && <SharesForm machineId={machineId} current={current} onDone={onClose} />}
    </Modal>
  );
}
