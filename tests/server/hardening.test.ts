import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { toCsv } from '../../shared/domain/csv';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;
beforeAll(async () => {
  context = await createTestContext();
});
afterAll(() => context.close());

describe('malformed multipart bodies', () => {
  it.each([
    ['an import', '/api/imports/parts', 'buyer'],
    ['a packing slip', '/api/dock/releases/1/attachments', 'receiving'],
  ] as const)('answer 400, not 500, on %s without a boundary or cut short', async (_what, path, role) => {
    const noBoundary = await request(context.app)
      .post(path)
      .set(bearer(context.tokens[role]))
      .set('Content-Type', 'multipart/form-data')
      .send('--x\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\n\r\npart_number\r\n');
    const truncated = await request(context.app)
      .post(path)
      .set(bearer(context.tokens[role]))
      .set('Content-Type', 'multipart/form-data; boundary=XYZ')
      .send(
        '--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\npart_nu',
      );

    expect(noBoundary.status).toBe(400);
    expect(noBoundary.body.error.message).toMatch(/upload could not be read/);
    expect(truncated.status).toBe(400);
    expect(truncated.body.error.message).toMatch(/upload could not be read/);
  });
});

describe('Strict-Transport-Security', () => {
  it('is sent over HTTPS (behind a proxy on loopback) and not over plain HTTP', async () => {
    const plain = await request(context.app).get('/api/health');
    const secure = await request(context.app).get('/api/health').set('X-Forwarded-Proto', 'https');

    expect(plain.headers['strict-transport-security']).toBeUndefined();
    expect(secure.headers['strict-transport-security']).toMatch(/max-age=\d+/);
  });
});

describe('user names', () => {
  it.each([
    ['a right-to-left override', 'Ana\u202Egpj.exe'],
    ['a line break', 'Ana\nAdmin'],
    ['a NUL', 'Ana\u0000'],
    ['a first-strong isolate', 'Ana\u2068x'],
  ])('refuses %s with 400 naming the field', async (_what, name) => {
    const response = await request(context.app)
      .post('/api/users')
      .set(bearer(context.tokens.admin))
      .send({ email: 'ana@example.com', name, role: 'viewer', password: 'long-enough-password' });

    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toEqual(['name']);
  });
});

// OWASP, "CSV Injection": a cell starting with =, +, -, @, tab or carriage return is prefixed with
// a single quote so that a spreadsheet shows it as text instead of running it.
describe('CSV exports', () => {
  it('neutralise text cells a spreadsheet would run as a formula, and keep numbers as numbers', () => {
    const csv = toCsv(
      ['part_number', 'qty'],
      [
        ['=HYPERLINK("http://x.example.com")', -4],
        ['+1', 2],
        ['-A', 3],
        ['@SUM(A1)', 4],
        ['\tTAB', 5],
        ['\rCR', 6],
        ['PLAIN-1', 7],
      ],
    );

    expect(csv.split('\r\n')).toEqual([
      'part_number,qty',
      `"'=HYPERLINK(""http://x.example.com"")",-4`,
      `"'+1",2`,
      `"'-A",3`,
      `"'@SUM(A1)",4`,
      `"'\tTAB",5`,
      `"'\rCR",6`,
      'PLAIN-1,7',
    ]);
  });
});
