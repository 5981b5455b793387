import { vi } from 'vitest';
import { flushPromises, mount, type ComponentMountingOptions } from '@vue/test-utils';
import { createPinia, setActivePinia, type Pinia } from 'pinia';
import { createMemoryHistory, type Router } from 'vue-router';
import { defineComponent, h, type Component } from 'vue';
import type { SessionUser } from '@shared/schemas/user';
import { writeToken } from '@/api/session-token';
import { createAppRouter } from '@/router';
import { useAuthStore } from '@/stores/auth';

export const demoUsers = {
  admin: { email: 'admin@example.com', name: 'Ada Admin', role: 'admin', supplierCode: null },
  buyer: { email: 'buyer@example.com', name: 'Bo Buyer', role: 'buyer', supplierCode: null },
} satisfies Record<string, SessionUser>;

/**
 * vi.waitFor with room for a busy machine: its own default gives up after one second, which a
 * loaded two-core runner can spend on one render. A check that fails still fails, only later.
 */
export function waitFor<T>(check: () => T | Promise<T>, options: { timeout?: number; interval?: number } = {}) {
  return vi.waitFor(check, { timeout: 10_000, ...options });
}

/** A fetch Response carrying JSON, as the server sends it. */
export function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  });
}

/** Replaces fetch with a mock answering each call in turn with the given responses. */
export function stubFetch(...responses: Response[]) {
  const fetchMock = vi.fn<typeof fetch>();
  for (const response of responses) fetchMock.mockResolvedValueOnce(response);
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

interface AppContext {
  pinia: Pinia;
  router: Router;
}

/** A fresh Pinia and the real router on memory history, optionally with someone signed in. */
export async function createAppContext(options: { user?: SessionUser; path?: string } = {}): Promise<AppContext> {
  const pinia = createPinia();
  setActivePinia(pinia);
  if (options.user) {
    writeToken('test-token');
    const auth = useAuthStore();
    auth.token = 'test-token';
    auth.user = options.user;
  }
  const router = createAppRouter(createMemoryHistory());
  await router.push(options.path ?? '/');
  await router.isReady();
  return { pinia, router };
}

/**
 * Mounts a component inside the app's Pinia and router, attached to the document for teleports,
 * and lets it settle: Element Plus links a form label to its input only after the first render.
 */
export async function mountInApp<C extends Component>(
  component: C,
  context: AppContext,
  options: ComponentMountingOptions<C> = {},
) {
  const wrapper = mount(component, {
    ...options,
    attachTo: document.body,
    global: { ...options.global, plugins: [context.pinia, context.router] },
  } as ComponentMountingOptions<C>);
  await flushPromises();
  return wrapper;
}

/** The form control a visible <label> points at, the way a person (or getByLabel) finds it. */
export function getByLabel(root: ParentNode, labelText: string): HTMLElement {
  const label = [...root.querySelectorAll('label')].find((candidate) => candidate.textContent?.trim() === labelText);
  if (!label) throw new Error(`no label "${labelText}"`);
  const control = label.htmlFor ? document.getElementById(label.htmlFor) : label.querySelector('input');
  if (!control) throw new Error(`label "${labelText}" points at nothing`);
  return control;
}

/** The button whose accessible text is exactly `name`. */
export function getButton(root: ParentNode, name: string): HTMLButtonElement {
  const button = [...root.querySelectorAll('button')].find((candidate) => candidate.textContent?.trim() === name);
  if (!button) throw new Error(`no button "${name}"`);
  return button;
}

/** A streamed 200 response whose body yields the given chunks, then stays open until aborted. */
export function eventStream(chunks: string[], signal?: AbortSignal | null): Response {
  const encoder = new TextEncoder();
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      for (const chunk of chunks) controller.enqueue(encoder.encode(chunk));
      signal?.addEventListener('abort', () => controller.error(new DOMException('aborted', 'AbortError')));
    },
  });
  return new Response(body, { status: 200, headers: { 'Content-Type': 'text/event-stream' } });
}

/** Mounts a bare component whose setup calls `listen`, so a composable's lifecycle hooks run. */
export function mountListener(listen: () => void) {
  const Listener = defineComponent({
    setup() {
      listen();
      return () => h('div');
    },
  });
  return mount(Listener);
}
