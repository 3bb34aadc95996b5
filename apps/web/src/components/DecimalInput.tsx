import { Text, TextInput, type TextInputProps } from '@mantine/core';

interface DecimalInputProps extends Omit<TextInputProps, 'leftSection' | 'rightSection'> {
  /** "$" for money fields. */
  prefix?: string;
  /** Unit shown after the value, e.g. "%", "h/yr", "ft". */
  unit?: string;
}

/**
 * Money and quantities stay text from the keyboard to the server, so no value is ever
 * rounded through a binary float on the way.
 */
export function DecimalInput({ prefix, unit, ...props }: DecimalInputProps) {
  return (
    <TextInput
      inputMode="decimal"
      autoComplete="off"
      leftSection={prefix ? <Text c="dimmed">{prefix}</Text> : undefined}
      rightSection={unit ? <Text c="dimmed" size="sm">{unit}</Text> : undefined}
      rightSectionWidth={unit ? Math.max(36, unit.length * 9 + 16) : undefined}
      {...props}
    />
  );
}
