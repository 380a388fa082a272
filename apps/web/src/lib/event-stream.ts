/**
 * Server-sent events read with fetch, so the bearer token can go along (EventSource cannot send headers).
 * Parses the text/event-stream format of the HTML standard ("server-sent events", §9.2): lines `event:`,
 * `data:` (several are joined with "\n"), `id:`, comments starting with ":", a blank line ends an event.
 */
import { ApiError, buildUrl, parseErrorResponse } from './api-client';
import { endRefusedSession, getAccessToken } from './token-store';

export interface StreamEvent {
  /** The event's type; "message" when the server names none. */
  type: string;
  data: string;
}

/** Splits a text/event-stream into events; feed it chunks of text, it calls `onEvent` per complete event. */
export function createEventParser(onEvent: (event: StreamEvent) => void): (chunk: string) => void {
  let buffer = '';
  let type = '';
  let data: string[] = [];
  return (chunk: string) => {
    buffer += chunk;
    let end: number;
    while ((end = buffer.search(/\r\n|\r|\n/)) >= 0) {
      const line = buffer.slice(0, end);
      buffer = buffer.slice(end + (buffer.startsWith('\r\n', end) ? 2 : 1));
      if (line === '') {
        if (data.length > 0) onEvent({ type: type || 'message', data: data.join('\n') });
        type = '';
        data = [];
        continue;
      }
      if (line.startsWith(':')) continue;
      const colon = line.indexOf(':');
      const field = colon < 0 ? line : line.slice(0, colon);
      let value = colon < 0 ? '' : line.slice(colon + 1);
      if (value.startsWith(' ')) value = value.slice(1);
      if (field === 'event') type = value;
      else if (field === 'data') data.push(value);
    }
  };
}

/**
 * Opens `path` under /api as an event stream and calls `onEvent` for each event until the server ends the
 * stream or `signal` aborts. Rejects with an ApiError for a non-2xx answer or when the stream cannot be read.
 */
export async function readEventStream(
  path: string,
  onEvent: (event: StreamEvent) => void,
  signal?: AbortSignal,
): Promise<void> {
  const token = getAccessToken();
  const headers: Record<string, string> = { Accept: 'text/event-stream' };
  if (token) headers.Authorization = `Bearer ${token}`;
  const response = await fetch(buildUrl(path), { headers, signal, cache: 'no-store' });
  if (!response.ok) {
    const error = await parseErrorResponse(response);
    if (response.status === 401 && token) endRefusedSession(token);
    throw error;
  }
  if (!response.body) throw new ApiError(0, 'STREAM.UNSUPPORTED', 'This browser cannot read event streams.');
  const reader = response.body.pipeThrough(new TextDecoderStream()).getReader();
  const parse = createEventParser(onEvent);
  for (;;) {
    const { value, done } = await reader.read();
    if (done) return;
    parse(value);
  }
}
