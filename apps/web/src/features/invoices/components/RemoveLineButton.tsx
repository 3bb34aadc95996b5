import { ActionIcon, Tooltip } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconTrash } from '@tabler/icons-react';
import type { InvoiceDto, InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { useDraftChange } from '../api/updateDraft';
import { extraLinesWithout } from '../draftEdits';

/** Only lines the owner added can be taken off a draft; priced work goes by changing the dates. */
export function RemoveLineButton({ invoice, line }: { invoice: InvoiceDto; line: InvoiceLineDto }) {
  const change = useDraftChange(invoice.id, (lineId: string) => ({ version: invoice.version, extraLines: extraLinesWithout(invoice, lineId) }));
  return (
    <Tooltip label={`Remove "${line.description}"`}>
      <ActionIcon
        variant="subtle"
        color="red"
        aria-label={`Remove ${line.description}`}
        loading={change.isPending}
        onClick={() =>
          change.mutate(line.id, {
            onError: (error) => notifications.show({ color: 'red', title: 'The line was not removed', message: error.message }),
          })
        }
      >
        <IconTrash size={18} />
      </ActionIcon>
    </Tooltip>
  );
}
