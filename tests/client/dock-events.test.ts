import { eventStream, jsonResponse, mountListener as mountWith, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { useDockEvents } from '@/composables/useDockEvents';

const mountListener = (onChange: (version: number) => void) => mountWith(() => useDockEvents(onChange));

describe('useDockEvents', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('reports each change of the dock version after the first, and ignores planning events', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn<typeof fetch>((_url, init) =>
        Promise.resolve(
          eventStream(
            [
              'event: planning\ndata: {"version":40}\n\n',
              'event: dock\ndata: {"version":2}\n\n',
              'event: planning\ndata: {"version":41}\n\n',
              'event: dock\ndata: {"version":2}\n\n',
              'event: dock\ndata: {"version":3}\n\n',
            ],
            init?.signal,
          ),
        ),
      ),
    );
    const onChange = vi.fn();

    const wrapper = mountListener(onChange);
    await waitFor(() => expect(onChange).toHaveBeenCalled());

    expect(onChange.mock.calls).toEqual([[3]]);
    wrapper.unmount();
  });

  it('stops listening when the role may not read the stream', async () => {
    vi.useFakeTimers();
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockResolvedValue(jsonResponse(403, { error: { code: 'forbidden', message: 'Your role may not do this.' } }));
    vi.stubGlobal('fetch', fetchMock);

    const wrapper = mountListener(vi.fn());
    await flushPromises();
    await vi.advanceTimersByTimeAsync(60_000);

    expect(fetchMock).toHaveBeenCalledTimes(1);
    wrapper.unmount();
  });
});
