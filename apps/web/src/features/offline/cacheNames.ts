/**
 * The service worker's copy of the cab form's reads. It holds one person's rows, so the web app
 * deletes it on sign-out and whenever a different person signs in on the phone.
 */
export const ENTRY_DATA_CACHE = 'hitchbook-entry-data';
