import { createTheme, type MantineColorsTuple } from '@mantine/core';

/** Deep teal-slate: the product's primary colour, dark enough for white text in bright sun. */
const harbor: MantineColorsTuple = [
  '#eaf3f4',
  '#d3e5e7',
  '#a8cbcf',
  '#7aaeb4',
  '#54969d',
  '#3b868e',
  '#2d767e',
  '#22626a',
  '#1c5058',
  '#133a40',
];

/** Warm clay: the accent for highlights and the second series on charts. */
const clay: MantineColorsTuple = [
  '#fbf0ea',
  '#f3ded2',
  '#e7bda5',
  '#dc9a76',
  '#d27d50',
  '#cc6b38',
  '#b95d2f',
  '#9d4d27',
  '#803f21',
  '#64311a',
];

/** Cool slate greys for text and borders, so the interface never looks washed-out in a cab. */
const slate: MantineColorsTuple = [
  '#f3f5f6',
  '#e5e9eb',
  '#c9d1d5',
  '#aab6bc',
  '#8e9da5',
  '#7b8c95',
  '#6b7d87',
  '#596a73',
  '#4b5b63',
  '#2e3a40',
];

// Type and controls are a size up from the defaults: the app is read at arm's length on a
// phone clipped to a cab window, often with gloves on.
export const theme = createTheme({
  primaryColor: 'harbor',
  primaryShade: { light: 7, dark: 5 },
  colors: { harbor, clay, slate },
  fontFamily: 'Lato, "Segoe UI", Roboto, Helvetica, Arial, sans-serif',
  headings: {
    fontFamily: 'Lato, "Segoe UI", Roboto, Helvetica, Arial, sans-serif',
    fontWeight: '700',
  },
  fontSizes: {
    xs: '0.8125rem',
    sm: '0.9375rem',
    md: '1.0625rem',
    lg: '1.25rem',
    xl: '1.5rem',
  },
  defaultRadius: 'md',
  cursorType: 'pointer',
  components: {
    Button: { defaultProps: { size: 'md' } },
    TextInput: { defaultProps: { size: 'md' } },
    PasswordInput: { defaultProps: { size: 'md' } },
    NumberInput: { defaultProps: { size: 'md' } },
    Select: { defaultProps: { size: 'md' } },
    Textarea: { defaultProps: { size: 'md' } },
    SegmentedControl: { defaultProps: { size: 'md' } },
    Anchor: { defaultProps: { c: 'harbor.8' } },
  },
});
