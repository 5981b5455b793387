// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { ApiError } from '@/api/http';
import { useLatestRequest } from '@/stores/latest-request';

/** A request whose answer the test hands over when it likes, like a slow server. */
function deferred<T>() {
  let resolve!: (value: T) => void;
  let reject!: (cause: unknown) => void;
  const promise = new Promise<T>((done, fail) => {
    resolve = done;
    reject = fail;
  });
  return { promise, resolve, reject };
}

describe('useLatestRequest', () => {
  it('lands only the latest answer, even when the older one arrives last and ignored its abort', async () => {
    const { run, loading } = useLatestRequest();
    const older = deferred<string>();
    const newer = deferred<string>();
    const signals: AbortSignal[] = [];
    const applied: string[] = [];
    const request = (answer: Promise<string>) => (signal: AbortSignal) => {
      signals.push(signal);
      return answer;
    };

    const first = run(request(older.promise), (answer) => applied.push(answer));
    const second = run(request(newer.promise), (answer) => applied.push(answer));
    newer.resolve('newer');
    older.resolve('older');
    await Promise.all([first, second]);

    expect(applied).toEqual(['newer']);
    expect(signals.map((signal) => signal.aborted)).toEqual([true, false]);
    expect(loading.value).toBe(false);
  });

  it('shows loading until the answer is applied, and not at all for a quiet refresh', async () => {
    const { run, loading } = useLatestRequest();
    const answer = deferred<number>();
    let loadingWhenApplied: boolean | null = null;

    const pending = run(
      () => answer.promise,
      () => (loadingWhenApplied = loading.value),
    );
    expect(loading.value).toBe(true);
    answer.resolve(1);
    await pending;
    const quiet = run(
      () => Promise.resolve(2),
      () => undefined,
      { quiet: true },
    );
    const loadingWhileQuiet = loading.value;
    await quiet;

    // Applied in the same tick that ends loading: a screen never draws new data under its mask.
    expect(loadingWhenApplied).toBe(true);
    expect(loadingWhileQuiet).toBe(false);
    expect(loading.value).toBe(false);
  });

  it('keeps an ApiError for the screen, forgets it on the next run, and throws anything else', async () => {
    const { run, error } = useLatestRequest();
    const refused = new ApiError(503, 'unavailable', 'The server ran into a problem.');

    await run(
      () => Promise.reject(refused),
      () => undefined,
    );
    expect(error.value).toBe(refused);
    await run(
      () => Promise.resolve(1),
      () => undefined,
    );
    expect(error.value).toBeNull();
    await expect(
      run(
        () => Promise.reject(new TypeError('bug')),
        () => undefined,
      ),
    ).rejects.toThrow('bug');
  });

  it('drops the request in flight when cancelled', async () => {
    const { run, cancel, loading } = useLatestRequest();
    const answer = deferred<string>();
    const applied: string[] = [];

    const pending = run(
      () => answer.promise,
      (value) => applied.push(value),
    );
    cancel();
    answer.resolve('late');
    await pending;

    expect(applied).toEqual([]);
    expect(loading.value).toBe(false);
  });
});
