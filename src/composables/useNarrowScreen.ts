import { onBeforeUnmount, ref, type Ref } from 'vue';

/** A phone's width: the layouts' own breakpoint for one column of content. */
export const NARROW_SCREEN = '(max-width: 600px)';

/**
 * True while the screen is as narrow as a phone, for choices CSS cannot make (a table column kept
 * in view on a wide screen takes most of a phone's). False where the browser cannot say (tests).
 */
export function useNarrowScreen(): Ref<boolean> {
  const query = typeof window !== 'undefined' && window.matchMedia ? window.matchMedia(NARROW_SCREEN) : null;
  const narrow = ref(query?.matches ?? false);
  if (!query) return narrow;
  const update = (event: MediaQueryListEvent) => {
    narrow.value = event.matches;
  };
  query.addEventListener('change', update);
  onBeforeUnmount(() => query.removeEventListener('change', update));
  return narrow;
}
