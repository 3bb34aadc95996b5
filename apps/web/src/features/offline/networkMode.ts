/**
 * The cab form's reads are tried even when the browser says it has no signal: the service
 * worker answers them from the copy it kept. TanStack Query's default would hold them back.
 */
export const OFFLINE_FIRST = 'offlineFirst' as const;

/**
 * Marks a read the service worker keeps for use without signal (see pwa.config.ts). Only the
 * cab form's reads carry it, so office lists are never answered from a kept copy.
 */
export const OFFLINE_KEEP_HEADER = 'X-Hitchbook-Offline';
export const KEEP_FOR_OFFLINE = { [OFFLINE_KEEP_HEADER]: 'keep' } as const;
