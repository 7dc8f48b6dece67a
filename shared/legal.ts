/**
 * The terms of use and the privacy notice as they stand. The version is the
 * date they took effect; it is stored on each account with the time the
 * person accepted them (users.terms_version, users.terms_accepted_at). Change
 * the date whenever the words of /terms or /privacy change in substance.
 */
export const TERMS_VERSION = '2026-12-05';

/** The version's date as the pages print it. */
export const TERMS_EFFECTIVE = '5 December 2026';

/** What a deleted account is called wherever its jobs, messages and reviews still show. */
export const DELETED_ACCOUNT_NAME = 'Deleted account';
