import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import type { SequenceUnit } from '@shared/schemas/sequence';
import SequenceUnitMenu from '@/components/SequenceUnitMenu.vue';

const unit: SequenceUnit = {
  id: 1,
  date: '2026-12-07',
  sequence: 1,
  model: 'M-A',
  serial: 'S1',
  qty: 1,
  status: 'planned',
  builtAt: null,
};

/**
 * A browser's Node.contains takes a Node or null and throws a TypeError for anything else, such as
 * the window (DOM Standard, interface Node: `boolean contains(Node? other)`; Web IDL converts the
 * argument and throws a TypeError when it is not a Node). happy-dom answers false instead, so the
 * test puts the browser's rule back.
 */
function containsAsBrowsersDo(): void {
  const contains = Node.prototype.contains;
  vi.spyOn(Node.prototype, 'contains').mockImplementation(function (this: Node, other: Node | null) {
    if (other !== null && !(other instanceof Node)) {
      throw new TypeError("Failed to execute 'contains' on 'Node': parameter 1 is not of type 'Node'.");
    }
    return contains.call(this, other);
  });
}

async function openMenu() {
  const anchor = document.createElement('button');
  document.body.append(anchor);
  const wrapper = mount(SequenceUnitMenu, {
    attachTo: document.body,
    props: { anchor: null, unit: null, canMoveUp: true, canMoveDown: true },
  });
  await wrapper.setProps({ anchor, unit });
  await flushPromises();
  return wrapper;
}

describe('SequenceUnitMenu', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    document.body.innerHTML = '';
  });

  it('closes without an error when the window is resized while it is open', async () => {
    containsAsBrowsersDo();
    const wrapper = await openMenu();
    expect(document.querySelector('[role="menu"]')).not.toBeNull();
    const uncaught: unknown[] = [];
    const onError = (event: ErrorEvent) => uncaught.push(event.error);
    window.addEventListener('error', onError);

    window.dispatchEvent(new Event('resize'));
    window.removeEventListener('error', onError);

    expect(uncaught).toEqual([]);
    expect(wrapper.emitted('close')).toEqual([[false]]);
    wrapper.unmount();
  });

  it('stays open when the menu itself scrolls and closes when the page scrolls', async () => {
    containsAsBrowsersDo();
    const wrapper = await openMenu();
    const menu = document.querySelector('[role="menu"]')!;

    menu.dispatchEvent(new Event('scroll'));
    expect(wrapper.emitted('close')).toBeUndefined();
    document.dispatchEvent(new Event('scroll'));

    expect(wrapper.emitted('close')).toEqual([[false]]);
    wrapper.unmount();
  });
});
