import { afterEach, describe, expect, it, vi } from 'vitest';
import { stubFetch } from '../testing/fetch-stub';
import { createEventParser, readEventStream, type StreamEvent } from './event-stream';
import { TOKEN_STORAGE_KEY } from './token-store';

function parseAll(chunks: string[]): StreamEvent[] {
  const events: StreamEvent[] = [];
  const parse = createEventParser((e) => events.push(e));
  chunks.forEach(parse);
  return events;
}

// Expected values follow the HTML Living Standard, "Server-sent events", §9.2.5–9.2.6 (parsing an event
// stream and its worked examples).
describe('the event-stream parser', () => {
  it('joins several data lines with a line feed, as in the standard’s stock-ticker example', () => {
    expect(parseAll(['data: YHOO\ndata: +2\ndata: 10\n\n'])).toEqual([
      { type: 'message', data: 'YHOO\n+2\n10' },
    ]);
  });

  it('skips comment lines, reads the event type and removes only one space after the colon', () => {
    expect(parseAll([': keep-alive\nevent: progress\ndata:  two spaces\n\n'])).toEqual([
      { type: 'progress', data: ' two spaces' },
    ]);
  });

  it('accepts CRLF, CR and LF line ends and events split anywhere between chunks', () => {
    expect(parseAll(['event: done\r\nda', 'ta: {"a":1}\r', '\r', 'data: x\n', '\n'])).toEqual([
      { type: 'done', data: '{"a":1}' },
      { type: 'message', data: 'x' },
    ]);
  });

  it('dispatches nothing for an event without data (the standard drops it)', () => {
    expect(parseAll(['event: progress\n\n'])).toEqual([]);
  });
});

describe('readEventStream', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('sends the bearer token and hands over each event of the body', async () => {
    window.localStorage.setItem(TOKEN_STORAGE_KEY, 'token-1');
    const { calls } = stubFetch({
      'GET /api/exports/e1/events': () =>
        new Response('event: progress\ndata: {"progress":40}\n\nevent: done\ndata: {"progress":100}\n\n', {
          status: 200,
          headers: { 'Content-Type': 'text/event-stream' },
        }),
    });
    const seen: StreamEvent[] = [];
    await readEventStream('/exports/e1/events', (e) => seen.push(e));
    expect(seen.map((e) => e.type)).toEqual(['progress', 'done']);
    expect(calls[0]?.headers.get('Accept')).toBe('text/event-stream');
    expect(calls[0]?.headers.get('Authorization')).toBe('Bearer token-1');
  });
});
