import type { JobStatus } from '@shared/schemas/jobs';
import { MAX_MESSAGE_LENGTH } from '@shared/schemas/values';
import { formatDate, formatTime, viewerParts } from '@client/lib/dates';

/** "14:07 EST" today, "Tue 14:07" this week, "3 Jul" this year, else "3 Jul 2025"; the whole moment is in fullTime. */
export function messageTime(iso: string, now = new Date()): string {
  const at = viewerParts(iso);
  const today = viewerParts(now);
  if (!at || !today) return iso;
  const age = now.getTime() - new Date(iso).getTime();
  if (at.day === today.day && at.month === today.month && at.year === today.year) return formatTime(iso);
  if (age < 6 * 24 * 3600_000) return `${at.weekday} ${at.hour}:${at.minute}`;
  if (at.year === today.year) return `${at.day} ${at.month}`;
  return formatDate(iso);
}

/** The whole date, time and zone, for a tooltip and for <time dateTime>. */
export { formatDateTime as fullTime } from '@client/lib/dates';

/** Shown beside the composer once a message nears the limit. */
export const COUNTER_FROM = MAX_MESSAGE_LENGTH - 400;

export function remainingWords(length: number): string {
  const left = MAX_MESSAGE_LENGTH - length;
  if (left >= 0) return `${left.toLocaleString('en-US')} ${left === 1 ? 'character' : 'characters'} left`;
  return `${(-left).toLocaleString('en-US')} ${left === -1 ? 'character' : 'characters'} over the limit`;
}

/** Why a conversation takes no new messages, in plain words. */
export function closedWords(jobStatus: JobStatus | undefined, side: 'builder' | 'shop'): string {
  if (jobStatus === 'cancelled') return 'This conversation is closed: the job was cancelled. You can still read it.';
  if (jobStatus === 'resolved') return 'This conversation is closed: the job is finished. You can still read it.';
  return side === 'shop'
    ? 'This conversation is closed: the job went to another shop. You can still read it.'
    : 'This conversation is closed: you gave the job to another shop. You can still read it.';
}

export const unreadWords = (count: number) => `${count} new`;

/** "Photo" or "3 photos", for a message without words in a one-line preview. */
export const photoCountWords = (count: number) => (count === 1 ? 'Photo' : `${count} photos`);
