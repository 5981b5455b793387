import { createAppContext, demoUsers, getButton, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, type VueWrapper } from '@vue/test-utils';
import type { SessionUser } from '@shared/schemas/user';
import ImportsView from '@/views/ImportsView.vue';

const planner: SessionUser = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null };

interface CannedReply {
  status: number;
  body: unknown;
}

/** Stands in for the browser's XMLHttpRequest: records what is sent and answers with canned replies. */
class FakeXhr {
  static replies: CannedReply[] = [];
  static sent: FakeXhr[] = [];

  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: FormData | null = null;
  status = 0;
  responseText = '';
  upload: { onprogress: ((event: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = {
    onprogress: null,
  };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;

  open(method: string, url: string): void {
    this.method = method;
    this.url = url;
  }

  setRequestHeader(name: string, value: string): void {
    this.headers[name] = value;
  }

  send(body: FormData): void {
    this.body = body;
    FakeXhr.sent.push(this);
    const reply = FakeXhr.replies.shift() ?? { status: 500, body: null };
    queueMicrotask(() => {
      this.upload.onprogress?.({ lengthComputable: true, loaded: 1, total: 1 });
      this.status = reply.status;
      this.responseText = reply.body === null ? '' : JSON.stringify(reply.body);
      this.onload?.();
    });
  }

  abort(): void {
    this.onabort?.();
  }
}

function stubXhr(...replies: CannedReply[]): void {
  FakeXhr.replies = replies;
  FakeXhr.sent = [];
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
}

async function openImports(user: SessionUser) {
  const context = await createAppContext({ user, path: '/imports' });
  return mountInApp(ImportsView, context);
}

function kindLabels(wrapper: VueWrapper): string[] {
  return wrapper.findAll('.imports-kind-picker__label').map((label) => label.text());
}

// Chooses a file through the drop area's own file input, as a person picking it in the dialog does.
async function chooseFile(wrapper: VueWrapper, name: string, text: string): Promise<void> {
  const input = wrapper.get('input[type="file"]');
  Object.defineProperty(input.element, 'files', {
    value: [new File([text], name, { type: 'text/csv' })],
    configurable: true,
  });
  await input.trigger('change');
  await waitFor(() => expect(wrapper.find('.imports-view__file').exists()).toBe(true));
}

async function chooseKind(wrapper: VueWrapper, value: string): Promise<void> {
  await wrapper.get(`input[type="radio"][value="${value}"]`).setValue(true);
}

const COUNTS_WITH_BAD_ROW = 'part_number,on_hand\nBAT-12-105,16\nNO-SUCH,3\n';

describe('ImportsView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  // Role rules from PRODUCT.md, "Published API": master data — admin, buyer; sequence — admin, planner.
  it('offers a buyer the master-data, stock and open-order files but not the build sequence', async () => {
    const wrapper = await openImports(demoUsers.buyer);

    expect(kindLabels(wrapper)).toEqual(['Suppliers', 'Parts', 'Bills of materials', 'On-hand counts', 'Open orders']);
  });

  it('offers a planner only the build sequence', async () => {
    const wrapper = await openImports(planner);

    expect(kindLabels(wrapper)).toEqual(['Build sequence']);
    expect(wrapper.get('.imports-view__columns').text()).toContain('Build sequence.');
    // The page says what this role may load, not what others may.
    expect(wrapper.text()).toContain('Load the build sequence from a CSV file.');
    expect(wrapper.text()).not.toContain('master data');
  });

  it('sends the file as the multipart field "file" and lists the rows the server refused, keeping the file chosen', async () => {
    const wrapper = await openImports(demoUsers.buyer);
    await chooseKind(wrapper, 'on-hand');
    await chooseFile(wrapper, 'counts.csv', COUNTS_WITH_BAD_ROW);
    // The 422 body of PRODUCT.md, "Published API": details [{row, column, message}], header = row 1.
    stubXhr({
      status: 422,
      body: {
        error: {
          code: 'import_error',
          message: '1 row has problems; nothing was imported.',
          details: [{ row: 3, column: 'part_number', message: "unknown part 'NO-SUCH'" }],
        },
      },
    });

    getButton(wrapper.element, 'Import 2 rows').click();
    await flushPromises();
    await flushPromises();

    const sent = FakeXhr.sent[0]!;
    expect(sent.method).toBe('POST');
    expect(sent.url).toBe('/api/imports/on-hand');
    expect(sent.headers.Authorization).toBe('Bearer test-token');
    const file = sent.body!.get('file') as File;
    expect(file.name).toBe('counts.csv');
    const report = wrapper.get('.imports-problem-table');
    expect(report.text()).toContain('1 problem; nothing was imported');
    const cells = report.findAll('.el-table__body td').map((cell) => cell.text());
    expect(cells).toEqual(['3', 'part_number', "unknown part 'NO-SUCH'"]);
    expect(wrapper.findAll('.imports-preview .has-problem')).toHaveLength(1);
    const retry = getButton(wrapper.element, 'Try again: import 2 rows');
    expect(retry.disabled).toBe(false);
  });

  it('reports how many rows went in and what changed, then lets the file go', async () => {
    const wrapper = await openImports(demoUsers.buyer);
    await chooseKind(wrapper, 'on-hand');
    await chooseFile(wrapper, 'counts.csv', 'part_number,on_hand\nBAT-12-105,16\nFK-FIN,75\n');
    stubXhr({ status: 200, body: { imported: 2 } });

    getButton(wrapper.element, 'Import 2 rows').click();
    await flushPromises();
    await flushPromises();

    const result = wrapper.get('.el-result');
    expect(result.text()).toContain('Imported 2 rows');
    expect(result.text()).toContain('2 on-hand counts set');
    expect(wrapper.find('.imports-view__file').exists()).toBe(false);
  });

  it('shows the server’s message for a file it would not take (413) and keeps the file for another try', async () => {
    const wrapper = await openImports(demoUsers.buyer);
    await chooseKind(wrapper, 'on-hand');
    await chooseFile(wrapper, 'counts.csv', COUNTS_WITH_BAD_ROW);
    stubXhr({ status: 413, body: { error: { code: 'payload_too_large', message: 'The file is larger than 5 MB.' } } });

    getButton(wrapper.element, 'Import 2 rows').click();
    await flushPromises();
    await flushPromises();

    expect(wrapper.get('.imports-view__outcome').text()).toContain('The file is larger than 5 MB.');
    expect(wrapper.find('.imports-view__file').text()).toContain('counts.csv');
  });

  it('refuses a file over 5 MB in the browser and sends nothing', async () => {
    const wrapper = await openImports(demoUsers.buyer);
    stubXhr();
    const input = wrapper.get('input[type="file"]');
    const big = new File(['x'], 'big.csv', { type: 'text/csv' });
    Object.defineProperty(big, 'size', { value: 6 * 1024 * 1024 });
    Object.defineProperty(input.element, 'files', { value: [big], configurable: true });

    await input.trigger('change');
    await flushPromises();

    expect(wrapper.text()).toContain('“big.csv” is 6 MB; an import file may be at most 5 MB.');
    expect(wrapper.find('.imports-view__file').exists()).toBe(false);
    expect(FakeXhr.sent).toHaveLength(0);
  });
});
