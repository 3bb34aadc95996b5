/**
 * The cab form's reads are tried even when the browser says it has no signal: the service
 * worker answers them from the copy it kept. TanStack Query's default would hold them back.
 */
export const OFFLINE_FIRST = 'offlineFirst' as const;
