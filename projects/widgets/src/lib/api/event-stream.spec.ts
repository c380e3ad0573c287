import { parseEventStream } from './event-stream';

describe('parseEventStream', () => {
  it('reads complete events and leaves a partial one for later', () => {
    const text =
      'id: 1\nevent: job\ndata: {"progress":0.5}\n\n: keep-alive\n\nid: 2\nevent: job\ndata: {"pro';
    const parsed = parseEventStream(text);
    expect(parsed.events).toEqual([{ event: 'job', data: '{"progress":0.5}', id: '1' }]);
    expect(text.slice(parsed.consumed)).toBe('id: 2\nevent: job\ndata: {"pro');
  });

  it('joins multi-line data and defaults the event name', () => {
    const parsed = parseEventStream('data: a\ndata: b\n\n');
    expect(parsed.events).toEqual([{ event: 'message', data: 'a\nb' }]);
  });

  it('accepts CRLF line ends and counts consumed characters in the original text', () => {
    const text = 'event: job\r\ndata: x\r\n\r\nrest';
    const parsed = parseEventStream(text);
    expect(parsed.events).toEqual([{ event: 'job', data: 'x' }]);
    expect(text.slice(parsed.consumed)).toBe('rest');
  });

  it('drops comment-only blocks', () => {
    expect(parseEventStream(': keep-alive\n\n').events).toEqual([]);
  });
});
