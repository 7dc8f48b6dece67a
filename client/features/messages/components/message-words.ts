import type { JobStatus } from '@shared/schemas/jobs';
import { MAX_MESSAGE_LENGTH } from '@shared/schemas/messages';

const clock = new Intl.DateTimeFormat('en-US', { hour: 'numeric', minute: '2-digit' });
const weekday = new Intl.DateTimeFormat('en-US', { weekday: 'short', hour: 'numeric', minute: '2-digit' });
const day = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric' });
const dayYear = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric' });
const full = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

/** "3:07 PM" today, "Tue 3:07 PM" this week, "Jul 3" this year, else "Jul 3, 2025". */
export function messageTime(iso: string, now = new Date()): string {
  const at = new Date(iso);
  const age = now.getTime() - at.getTime();
  if (at.toDateString() === now.toDateString()) return clock.format(at);
  if (age < 6 * 24 * 3600_000) return weekday.format(at);
  if (at.getFullYear() === now.getFullYear()) return day.format(at);
  return dayYear.format(at);
}

/** The whole date and time, for a tooltip and for <time dateTime>. */
export const fullTime = (iso: string) => full.format(new Date(iso));

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
