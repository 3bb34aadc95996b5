/** Figures in columns line up digit under digit. */
export const TABULAR = { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' } as const;
