import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;
let operations: { method: 'get' | 'post' | 'put' | 'patch' | 'delete'; path: string }[];

beforeAll(async () => {
  context = await createTestContext();
  const document = (await request(context.app).get('/api/openapi.json')).body as {
    paths: Record<string, Record<string, unknown>>;
  };
  operations = Object.entries(document.paths).flatMap(([path, methods]) =>
    Object.keys(methods)
      .filter((method) => ['get', 'post', 'put', 'patch', 'delete'].includes(method))
      .filter(() => path !== '/events')
      .map((method) => ({ method: method as 'get', path })),
  );
});
afterAll(() => context.close());

const junkValue = fc.oneof(
  fc.string({ maxLength: 30 }),
  fc.integer(),
  fc.double(),
  fc.boolean(),
  fc.constant(null),
  fc.constantFrom('', ' ', '2026-02-30', '-1', '1e309', 'NaN', '../../etc/passwd', '%00', '{}', '[]'),
);
// Objects and arrays only: the HTTP client cannot send a bare number or boolean as a JSON body.
const junkBody = fc.oneof(
  fc.dictionary(
    fc.oneof(
      fc.string({ maxLength: 12 }),
      fc.constantFrom(
        'email',
        'password',
        'role',
        'lines',
        'cardNumber',
        'event',
        'containerQty',
        'dailyDemand',
        'workingWeekdays',
        'holidays',
      ),
    ),
    fc.jsonValue({ maxDepth: 2 }),
    { maxKeys: 6 },
  ),
  fc.array(fc.jsonValue({ maxDepth: 1 }), { maxLength: 4 }),
);

// PRODUCT.md error contract: bad input is a 4xx with the error shape, never a 500.
describe('every published route under malformed input', () => {
  it('answers 4xx in the error shape, never 500, for junk parameters, query and body', async () => {
    expect(operations.length).toBeGreaterThan(20);

    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 0, max: 10_000 }),
        junkValue,
        fc.dictionary(
          fc.constantFrom('part', 'from', 'to', 'supplier', 'format', 'cards', 'source', 'status'),
          junkValue,
          { maxKeys: 4 },
        ),
        junkBody,
        async (pick, pathValue, query, body) => {
          const operation = operations[pick % operations.length];
          const path = `/api${operation.path.replace(/\{\w+\}/g, encodeURIComponent(String(pathValue)))}`;
          const stringQuery = Object.fromEntries(Object.entries(query).map(([key, value]) => [key, String(value)]));

          const response = await request(context.app)
            [operation.method](path)
            .query(stringQuery)
            .set(bearer(context.tokens.admin))
            .send(body as object);

          if (response.status >= 400) {
            expect(response.status, `${operation.method.toUpperCase()} ${path} ${JSON.stringify(body)}`).toBeLessThan(
              500,
            );
            expect(response.body.error?.code, `${operation.method.toUpperCase()} ${path}`).toEqual(expect.any(String));
          }
        },
      ),
      { numRuns: 400 },
    );
  });
});
