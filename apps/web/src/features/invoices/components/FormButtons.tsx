import { Button, Group } from '@mantine/core';

export function FormButtons({ submitLabel, submitting, onCancel, color }: { submitLabel: string; submitting: boolean; onCancel: () => void; color?: string }) {
  return (
    <Group justify="flex-end" mt="sm">
      <Button variant="default" onClick={onCancel}>
        Cancel
      </Button>
      <Button type="submit" loading={submitting} color={color}>
        {submitLabel}
      </Button>
    </Group>
  );
}
