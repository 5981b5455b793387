import { afterEach, describe, expect, it, vi } from 'vitest';
import { fetchFile } from '@/api/download';
import { ApiError } from '@/api/http';
import { downloadDemandCsv } from '@/api/horizon';
import { TOKEN_KEY } from '@/api/session-token';
import { jsonResponse, stubFetch } from './helpers';

function csvResponse(disposition: string | null): Response {
  const headers: Record<string, string> = { 'Content-Type': 'text/csv' };
  if (disposition) headers['Content-Disposition'] = disposition;
  return new Response('part_number,supplier_code,2026-12-01,total\r\nBAT-06-225,FBS,32,32\r\n', {
    status: 200,
    headers,
  });
}

describe('fetchFile', () => {
  afterEach(() => {
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('names the file after the quoted filename parameter of Content-Disposition', async () => {
    stubFetch(csvResponse('attachment; filename="demand-2026-12-01-FBS.csv"'));

    const file = await fetchFile('/demand', 'fallback.csv');

    expect(file.filename).toBe('demand-2026-12-01-FBS.csv');
    expect(await file.blob.text()).toContain('BAT-06-225,FBS,32,32');
  });

  it('prefers the RFC 8187 encoded filename* parameter', async () => {
    // RFC 6266, section 5 "Examples" (from memory): filename="EURO rates" together with
    // filename*=utf-8''%e2%82%ac%20rates names the file "€ rates".
    stubFetch(csvResponse(`attachment; filename="EURO rates"; filename*=utf-8''%e2%82%ac%20rates`));

    const file = await fetchFile('/demand', 'fallback.csv');

    expect(file.filename).toBe('€ rates');
  });

  it('falls back to the given name when the server suggests none', async () => {
    stubFetch(csvResponse(null));

    const file = await fetchFile('/demand', 'fallback.csv');

    expect(file.filename).toBe('fallback.csv');
  });

  it('throws the server’s error rather than saving an error page', async () => {
    stubFetch(jsonResponse(404, { error: { code: 'not_found', message: 'No supplier ZZZ.' } }));

    await expect(fetchFile('/demand', 'fallback.csv')).rejects.toEqual(
      new ApiError(404, 'not_found', 'No supplier ZZZ.'),
    );
  });
});

describe('downloadDemandCsv', () => {
  afterEach(() => {
    localStorage.clear();
    vi.unstubAllGlobals();
    vi.restoreAllMocks();
  });

  it('asks for CSV with the same horizon and supplier as the screen, with the session token', async () => {
    localStorage.setItem(TOKEN_KEY, 'abc.def.ghi');
    const fetchMock = stubFetch(csvResponse('attachment; filename="demand-2026-12-01-FBS.csv"'));
    vi.spyOn(URL, 'createObjectURL').mockReturnValue('blob:demand');
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    const clicked: string[] = [];
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicked.push(this.download);
    });

    const filename = await downloadDemandCsv({ from: '2026-12-01', to: '2026-12-28', supplier: 'FBS' });

    const [url, init] = fetchMock.mock.calls[0]!;
    const sent = new URL(String(url), 'http://localhost');
    expect(sent.pathname).toBe('/api/demand');
    expect(Object.fromEntries(sent.searchParams)).toEqual({
      from: '2026-12-01',
      to: '2026-12-28',
      supplier: 'FBS',
      format: 'csv',
    });
    expect((init?.headers as Record<string, string>).Authorization).toBe('Bearer abc.def.ghi');
    expect(filename).toBe('demand-2026-12-01-FBS.csv');
    expect(clicked).toEqual(['demand-2026-12-01-FBS.csv']);
  });
});
