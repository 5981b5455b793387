import { eventStream, jsonResponse, mountListener as mountWith, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import { flushPromises } from '@vue/test-utils';
import { TOKEN_KEY } from '@/api/session-token';
import { EventStreamParser, usePlanningEvents } from '@/composables/usePlanningEvents';

const mountListener = (onChange: (version: number) => void) => mountWith(() => usePlanningEvents(onChange));

describe('EventStreamParser', () => {
  // WHATWG HTML Living Standard, 9.2 "Server-sent events", examples in "Parsing an event
  // stream" / "Interpreting an event stream" (from memory): several data lines make one event
  // joined by newlines, and one space after the colon is dropped, so "data:test" and
  // "data: test" carry the same data.
  it('joins data lines of one event with newlines', () => {
    const events = new EventStreamParser().feed('data: YHOO\ndata: +2\ndata: 10\n\n');

    expect(events).toEqual([{ event: 'message', data: 'YHOO\n+2\n10' }]);
  });

  it('drops one leading space after the colon and ignores comments', () => {
    const events = new EventStreamParser().feed(': keep-alive\n\ndata:test\n\ndata: test\n\n');

    expect(events).toEqual([
      { event: 'message', data: 'test' },
      { event: 'message', data: 'test' },
    ]);
  });

  it('reads the same events whatever the chunk boundaries, for LF, CRLF and CR line ends', () => {
    const stream =
      'retry: 3000\nevent: planning\ndata: {"version":7}\n\n: keep-alive\n\nevent: planning\ndata: {"version":8}\n\n';
    const whole = (text: string) => new EventStreamParser().feed(text);

    fc.assert(
      fc.property(
        fc.array(fc.nat(stream.length), { maxLength: 8 }),
        fc.constantFrom('\n', '\r\n', '\r'),
        (cuts, lineEnd) => {
          const text = stream.replace(/\n/g, lineEnd);
          const points = [...new Set(cuts.map((cut) => Math.min(cut, text.length)))].sort((a, b) => a - b);
          const parser = new EventStreamParser();
          const events = [0, ...points].flatMap((start, index) =>
            parser.feed(text.slice(start, points[index] ?? text.length)),
          );
          expect(events).toEqual(whole(text));
        },
      ),
    );
    expect(whole(stream)).toEqual([
      { event: 'planning', data: '{"version":7}' },
      { event: 'planning', data: '{"version":8}' },
    ]);
    expect(whole(stream.replace(/\n/g, '\r\n'))).toEqual(whole(stream));
    expect(whole(stream.replace(/\n/g, '\r'))).toEqual(whole(stream));
  });
});

describe('usePlanningEvents', () => {
  afterEach(() => {
    localStorage.clear();
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('takes the first version as a baseline and reports each later change once', async () => {
    localStorage.setItem(TOKEN_KEY, 'abc.def.ghi');
    const fetchMock = vi.fn<typeof fetch>((_url, init) =>
      Promise.resolve(
        eventStream(
          [
            'event: planning\ndata: {"version":3}\n\n',
            'event: planning\ndata: {"version":3}\n\n',
            'event: planning\ndata: {"version":4}\n\n',
          ],
          init?.signal,
        ),
      ),
    );
    vi.stubGlobal('fetch', fetchMock);
    const onChange = vi.fn();

    const wrapper = mountListener(onChange);
    await waitFor(() => expect(onChange).toHaveBeenCalled());

    expect(onChange.mock.calls).toEqual([[4]]);
    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/events');
    expect((init?.headers as Record<string, string>).Authorization).toBe('Bearer abc.def.ghi');
    wrapper.unmount();
  });

  it('reports a change made while the stream was down once it reconnects', async () => {
    vi.useFakeTimers();
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockResolvedValueOnce(closedStream('event: planning\ndata: {"version":5}\n\n'))
      .mockImplementation((_url, init) =>
        Promise.resolve(eventStream(['event: planning\ndata: {"version":6}\n\n'], init?.signal)),
      );
    vi.stubGlobal('fetch', fetchMock);
    const onChange = vi.fn();

    const wrapper = mountListener(onChange);
    await flushPromises();
    await vi.advanceTimersByTimeAsync(1000);
    await flushPromises();

    expect(fetchMock).toHaveBeenCalledTimes(2);
    expect(onChange.mock.calls).toEqual([[6]]);
    wrapper.unmount();
  });

  it('stops listening when the session is refused', async () => {
    vi.useFakeTimers();
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockResolvedValue(jsonResponse(401, { error: { code: 'unauthorized', message: 'Please sign in.' } }));
    vi.stubGlobal('fetch', fetchMock);

    const wrapper = mountListener(vi.fn());
    await flushPromises();
    await vi.advanceTimersByTimeAsync(60_000);

    expect(fetchMock).toHaveBeenCalledTimes(1);
    wrapper.unmount();
  });
});

/** A stream that delivers its text and then ends, as when the server restarts. */
function closedStream(text: string): Response {
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(new TextEncoder().encode(text));
      controller.close();
    },
  });
  return new Response(body, { status: 200 });
}
