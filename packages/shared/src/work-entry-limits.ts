// Plain numbers with no decimal.js behind them, so that the cab form can use them before it loads any.

/** Longer than this in one entry is possible (harvest) but worth a second look. */
export const LONG_ENTRY_HOURS = 16;
