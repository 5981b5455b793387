import { markRaw, type Component } from 'vue';
import { CircleCheck, CircleClose, Clock, Message, RefreshRight } from '@element-plus/icons-vue';
import type { OutboxMessage } from '@shared/schemas/outbox';
import { countOf, formatWhen } from '@/format';

/** How a notice's delivery looks: a word, our own icon and a tone class; never colour alone. */
export interface DeliveryLook {
  word: string;
  icon: Component;
  tone: 'is-sent' | 'is-failing' | 'is-retrying' | 'is-waiting' | 'is-none';
}

/** The delivery state of an outbox notice, in a word or two. */
export function deliveryLook(message: Pick<OutboxMessage, 'status' | 'attempts'>): DeliveryLook {
  if (message.status === 'sent') return { word: 'Sent', icon: markRaw(CircleCheck), tone: 'is-sent' };
  if (message.status === 'failing') return { word: 'Failing', icon: markRaw(CircleClose), tone: 'is-failing' };
  if (message.attempts > 0) return { word: 'Retrying', icon: markRaw(RefreshRight), tone: 'is-retrying' };
  return { word: 'Waiting', icon: markRaw(Clock), tone: 'is-waiting' };
}

/** Whether "send again" can still do something: the mail server has not taken the notice. */
export function canSendAgain(message: Pick<OutboxMessage, 'status'> | null): boolean {
  return message !== null && message.status !== 'sent';
}

/** When the notice is tried next: "now" once it is due. */
export function nextTryWords(message: Pick<OutboxMessage, 'nextAttemptAt'>, now = new Date()): string {
  if (!message.nextAttemptAt) return '';
  return new Date(message.nextAttemptAt).getTime() <= now.getTime() ? 'now' : formatWhen(message.nextAttemptAt, now);
}

/** One line on a notice's delivery so far, e.g. "Failing since 14:05 · 3 attempts · next try 14:20". */
export function deliverySummary(message: OutboxMessage, now = new Date()): string {
  if (message.status === 'sent') {
    const after = message.attempts > 1 ? ` after ${message.attempts} attempts` : '';
    return `Sent ${formatWhen(message.sentAt, now)}${after}`;
  }
  const parts =
    message.status === 'failing' && message.firstFailedAt
      ? [`Failing since ${formatWhen(message.firstFailedAt, now)}`, countOf(message.attempts, 'attempt', 'attempts')]
      : [message.attempts > 0 ? countOf(message.attempts, 'attempt', 'attempts') : 'Not tried yet'];
  const next = nextTryWords(message, now);
  if (next) parts.push(`next try ${next}`);
  return parts.join(' · ');
}

/** A release's e-mail state in a few words, for the release list. */
export function releaseNoticeLook(notice: OutboxMessage | null, now = new Date()): DeliveryLook {
  if (!notice) return { word: 'No e-mail yet', icon: markRaw(Message), tone: 'is-none' };
  if (notice.status === 'sent')
    return { word: `E-mail sent ${formatWhen(notice.sentAt, now)}`, icon: markRaw(CircleCheck), tone: 'is-sent' };
  if (notice.status === 'failing') {
    const since = notice.firstFailedAt ? ` since ${formatWhen(notice.firstFailedAt, now)}` : '';
    return { word: `E-mail failing${since} — retrying`, icon: markRaw(CircleClose), tone: 'is-failing' };
  }
  return { word: 'E-mail waiting', icon: markRaw(Clock), tone: 'is-waiting' };
}

/** A run of mail text: plain words, or a web address to show as a link. */
export interface TextSegment {
  text: string;
  href: string | null;
}

// http(s) addresses up to the next space or angle bracket; trailing sentence punctuation is not part of them.
const WEB_ADDRESS = /https?:\/\/[^\s<>"]+/g;
const TRAILING_PUNCTUATION = /[.,;:!?)\]'’”]+$/;

/** Splits plain mail text into words and web addresses, so the addresses can be made links. */
export function linkSegments(text: string): TextSegment[] {
  const segments: TextSegment[] = [];
  let last = 0;
  for (const match of text.matchAll(WEB_ADDRESS)) {
    const address = match[0].replace(TRAILING_PUNCTUATION, '');
    const start = match.index;
    if (start > last) segments.push({ text: text.slice(last, start), href: null });
    segments.push({ text: address, href: address });
    last = start + address.length;
  }
  if (last < text.length) segments.push({ text: text.slice(last), href: null });
  return segments;
}
