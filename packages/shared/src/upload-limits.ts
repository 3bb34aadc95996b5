// Plain numbers with no zod behind them, so that a page can check a picked file before it loads any schema.

/** At most 10 MB per file (a phone photo of a receipt is a few MB). */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

/** Enough for the pass, the field's corners and a broken part; more belongs in the machine's records. */
export const MAX_ENTRY_PHOTOS = 12;
