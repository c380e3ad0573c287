import { describe, expect, it } from 'vitest';
import { extraNameHeight, nameWidth, wrapAxisName } from './axis-name';

describe('wrapAxisName', () => {
  const name = 'Water flea (Daphnia pulex) (g C m⁻²)';

  it('leaves a name that fits, or any name when no width is known', () => {
    expect(wrapAxisName(name, 1000)).toBe(name);
    expect(wrapAxisName(name, 0)).toBe(name);
    expect(extraNameHeight(name)).toBe(0);
  });

  it('breaks at spaces into lines within the width, losing no word', () => {
    const wrapped = wrapAxisName(name, 120);
    const lines = wrapped.split('\n');
    expect(lines.length).toBeGreaterThan(1);
    for (const line of lines) expect(nameWidth(line)).toBeLessThanOrEqual(120);
    expect(lines.join(' ')).toBe(name);
    expect(extraNameHeight(wrapped)).toBe(16 * (lines.length - 1));
  });

  it('keeps a parenthesised Latin name or unit whole', () => {
    expect(wrapAxisName(name, 130)).toBe('Water flea\n(Daphnia pulex)\n(g C m⁻²)');
  });

  it('gives a word wider than the width a line of its own', () => {
    expect(wrapAxisName('Scenedesmus-and-other-green-algae (g)', 60)).toBe(
      'Scenedesmus-and-other-green-algae\n(g)',
    );
  });
});
