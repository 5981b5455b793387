import { onBeforeUnmount, onMounted } from 'vue';

// Two gaps in Element Plus, filled wherever its parts appear:
// - a table scrolls its body in a wrapper that takes no focus, so a keyboard user could not
//   scroll a long or wide table: such wrappers join the tab order;
// - the page-size choice of a pagination bar is a select without a name: it gets one.
const TABLE_SCROLLER = '.el-table__body-wrapper .el-scrollbar__wrap:not([tabindex])';
const PAGE_SIZE_INPUT = '.el-pagination__sizes input:not([aria-label])';

function patch(root: ParentNode): void {
  for (const scroller of root.querySelectorAll<HTMLElement>(TABLE_SCROLLER)) scroller.tabIndex = 0;
  for (const input of root.querySelectorAll<HTMLElement>(PAGE_SIZE_INPUT))
    input.setAttribute('aria-label', 'Rows per page');
}

/** Keeps table bodies scrollable from the keyboard and page-size selects named while mounted. */
export function useElementPlusAccessibility(): void {
  let observer: MutationObserver | null = null;

  onMounted(() => {
    patch(document.body);
    observer = new MutationObserver(() => patch(document.body));
    observer.observe(document.body, { childList: true, subtree: true });
  });

  onBeforeUnmount(() => observer?.disconnect());
}
