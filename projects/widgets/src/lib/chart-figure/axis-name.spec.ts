import { describe, expect, it } from 'vitest';
import { extraNameHeight, fitAxisNames, nameWidth, wrapAxisName } from './axis-name';

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

describe('fitAxisNames', () => {
  const grid = { left: 72, right: 24, top: 56, bottom: 56 };
  const names = {
    x: 'Green algae (Scenedesmus spp.) (g C m⁻²)',
    y: 'Water flea (Daphnia pulex) (g C m⁻²)',
  };

  it('breaks both names to the plot inside the grid and makes room for their extra lines', () => {
    const fitted = fitAxisNames(grid, 288, names);
    expect(fitted.x).toBe(wrapAxisName(names.x, 288 - 96));
    expect(fitted.y).toBe(wrapAxisName(names.y, 288 - 96));
    expect(fitted.grid).toEqual({
      ...grid,
      top: 56 + extraNameHeight(fitted.y),
      bottom: 56 + extraNameHeight(fitted.x),
    });
    expect(fitted.grid.top).toBeGreaterThan(56);
  });

  it('leaves names and grid alone when the width is not known', () => {
    expect(fitAxisNames(grid, undefined, names)).toEqual({ ...names, grid });
  });
});
