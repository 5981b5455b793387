import { createAppContext, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { AuditList } from '@shared/schemas/audit';
import AuditView from '@/views/AuditView.vue';

const planner = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null } as const;

const trail: AuditList = {
  events: [
    {
      id: 2,
      at: '2026-12-02T09:30:00.000Z',
      actorEmail: 'buyer@example.com',
      action: 'update',
      kind: 'part',
      subject: 'BOLT-8',
      changes: { before: { leadTimeDays: 3 }, after: { leadTimeDays: 5 } },
      summary: 'lead time days: 3 → 5',
    },
    {
      id: 1,
      at: '2026-12-01T09:30:00.000Z',
      actorEmail: null,
      action: 'reverse-build',
      kind: 'kanban_loop',
      subject: 'GRP-W',
      changes: null,
      summary: '',
    },
  ],
  truncated: false,
};

afterEach(() => {
  document.body.innerHTML = '';
  localStorage.clear();
  vi.unstubAllGlobals();
});

describe('AuditView', () => {
  it('lists each change with who made it and from → to, and sends the subject filter to the server', async () => {
    const fetchMock = vi.fn<typeof fetch>((input) => {
      const url = new URL(String(input), 'http://localhost');
      if (url.pathname === '/api/audit/kinds') return Promise.resolve(jsonResponse(200, ['part', 'supplier']));
      return Promise.resolve(jsonResponse(200, trail));
    });
    vi.stubGlobal('fetch', fetchMock);
    const context = await createAppContext({ user: planner, path: '/admin/audit' });

    const wrapper = await mountInApp(AuditView, context);
    const subject = wrapper.get('input[aria-label="Subject"]');
    await subject.setValue('BOLT');
    await flushPromises();

    expect(wrapper.text()).toContain('buyer@example.com');
    expect(wrapper.text()).toContain('lead time days: 3 → 5');
    expect(wrapper.get('[data-test="audit-summary"]').text()).toBe('2 changes');
    // Actions and kinds of record in words, never their codes.
    const rows = wrapper.findAll('tr.el-table__row').map((row) => row.text());
    expect(rows[0]).toContain('UpdatePart');
    expect(rows[1]).toContain('Reverse buildKanban loop');
    expect(wrapper.text()).not.toContain('kanban_loop');
    const last = new URL(String(fetchMock.mock.calls.at(-1)?.[0]), 'http://localhost');
    expect(last.pathname).toBe('/api/audit');
    expect(last.searchParams.get('subject')).toBe('BOLT');
  });
});
