import { markRaw, type Component } from 'vue';
import { Check, Minus, Plus } from '@element-plus/icons-vue';
import { CARD_STATES, type CardEvent, type CardState } from '@shared/domain/card-cycle';
import type { LoopKind, LoopProposal } from '@shared/schemas/loops';

/**
 * Words and swatches for card states. The tones are muted on purpose (teal, ochre, slate, sand) so
 * they never read as alarm colours; the word is always shown or announced beside the swatch.
 */
export const CARD_STATE_LOOK: Record<CardState, { word: string; hint: string; swatch: string; ink: string }> = {
  full: { word: 'Full', hint: 'in the rack with parts', swatch: '#5e8f8a', ink: '#ffffff' },
  empty: { word: 'Empty', hint: 'signalled, waiting to be ordered', swatch: '#c49a4a', ink: '#2a2621' },
  ordered: { word: 'Ordered', hint: 'on a release to the supplier', swatch: '#6c7a89', ink: '#ffffff' },
  shipped: { word: 'Shipped', hint: 'on its way back with parts', swatch: '#d9c9a7', ink: '#2a2621' },
};

/** The states in cycle order, for legends and strips. */
export const CARD_STATE_ORDER: readonly CardState[] = CARD_STATES;

/** Loop kind in words. */
export const LOOP_KIND_WORDS: Record<LoopKind, string> = {
  supplier: 'Supplier',
  supermarket: 'Supermarket',
};

/** What each scan event does to a card, in words for the scan screen. */
export const CARD_EVENT_WORDS: Record<CardEvent, string> = {
  consume: 'Signal empty',
  release: 'Release',
  ship: 'Ship',
  receive: 'Receive',
};

/** Which loops the table shows: all, or only those with one kind of proposal. */
export type ProposalFilter = 'all' | LoopProposal['action'];

/** The proposal badge's word, icon and tone. */
export interface ProposalLook {
  action: LoopProposal['action'];
  count: number;
  word: string;
  icon: Component;
  tone: 'add' | 'pull' | 'right';
}

/** The server's proposal (cards to add or pull so active equals recommended), as the badge shows it. */
export function proposalLook(proposal: LoopProposal): ProposalLook {
  const { action, count } = proposal;
  if (action === 'add') return { action, count, word: `Add ${count}`, icon: markRaw(Plus), tone: 'add' };
  if (action === 'pull') return { action, count, word: `Pull ${count}`, icon: markRaw(Minus), tone: 'pull' };
  return { action: 'none', count: 0, word: 'Right-sized', icon: markRaw(Check), tone: 'right' };
}
