/** One Server-Sent Event (the fields Tropline's job stream uses). */
export interface StreamEvent {
  /** The `event:` field; `message` when absent. */
  readonly event: string;
  /** The `data:` lines joined by newlines. */
  readonly data: string;
  /** The `id:` field, when given. */
  readonly id?: string;
}

/** Events complete so far and how many characters of the text they used. */
export interface ParsedStream {
  /** Every complete event, in order (comments and empty events dropped). */
  readonly events: readonly StreamEvent[];
  /** Characters consumed; the rest is an event still arriving. */
  readonly consumed: number;
}

/**
 * Parses the complete events of a `text/event-stream` body (WHATWG HTML, "server-sent events"):
 * events end at a blank line, `:` lines are comments, CRLF and CR count as line ends. An
 * incomplete trailing event is left for the next call, which passes the text from `consumed`.
 */
export function parseEventStream(text: string): ParsedStream {
  const events: StreamEvent[] = [];
  const normalised = text.replace(/\r\n?/g, '\n');
  let consumed = 0;
  let offset = 0;
  for (;;) {
    const end = normalised.indexOf('\n\n', offset);
    if (end < 0) break;
    const block = normalised.slice(offset, end);
    offset = end + 2;
    consumed = originalOffset(text, offset);
    let event = 'message';
    let id: string | undefined;
    const data: string[] = [];
    for (const line of block.split('\n')) {
      if (line === '' || line.startsWith(':')) continue;
      const colon = line.indexOf(':');
      const field = colon < 0 ? line : line.slice(0, colon);
      const value = colon < 0 ? '' : line.slice(colon + 1).replace(/^ /, '');
      if (field === 'event') event = value;
      else if (field === 'data') data.push(value);
      else if (field === 'id') id = value;
    }
    if (data.length) events.push({ event, data: data.join('\n'), ...(id ? { id } : {}) });
  }
  return { events, consumed };
}

/** Maps an offset in the CR/CRLF-normalised text back to the original text. */
function originalOffset(text: string, normalisedOffset: number): number {
  let n = 0;
  let i = 0;
  while (n < normalisedOffset && i < text.length) {
    if (text[i] === '\r' && text[i + 1] === '\n') i++;
    i++;
    n++;
  }
  return i;
}
