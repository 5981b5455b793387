import { onBeforeUnmount, onMounted } from 'vue';

// Element Plus tables scroll their body in a wrapper that takes no focus, so a keyboard user
// could not scroll a long or wide table. Such wrappers join the tab order, wherever they appear.
const TABLE_SCROLLER = '.el-table__body-wrapper .el-scrollbar__wrap:not([tabindex])';

function makeFocusable(root: ParentNode): void {
  for (const scroller of root.querySelectorAll<HTMLElement>(TABLE_SCROLLER)) scroller.tabIndex = 0;
}

/** Keeps every table body that scrolls reachable with the Tab key while the component is mounted. */
export function useKeyboardScrollableTables(): void {
  let observer: MutationObserver | null = null;

  onMounted(() => {
    makeFocusable(document.body);
    observer = new MutationObserver(() => makeFocusable(document.body));
    observer.observe(document.body, { childList: true, subtree: true });
  });

  onBeforeUnmount(() => observer?.disconnect());
}
