import { zoomWindow } from './zoom-keys';

describe('zoomWindow', () => {
  it('halves the span about the centre on zoom in', () => {
    expect(zoomWindow({ start: 0, end: 100 }, 'in')).toEqual({ start: 25, end: 75 });
  });

  it('doubles the span on zoom out without leaving 0–100', () => {
    expect(zoomWindow({ start: 0, end: 40 }, 'out')).toEqual({ start: 0, end: 80 });
    expect(zoomWindow({ start: 10, end: 90 }, 'out')).toEqual({ start: 0, end: 100 });
  });

  it('moves by a fifth of the span and stops at the ends', () => {
    expect(zoomWindow({ start: 50, end: 100 }, 'left')).toEqual({ start: 40, end: 90 });
    expect(zoomWindow({ start: 50, end: 100 }, 'right')).toEqual({ start: 50, end: 100 });
  });

  it('never zooms narrower than 2 %', () => {
    expect(zoomWindow({ start: 49, end: 51 }, 'in')).toEqual({ start: 49.5, end: 51.5 });
  });

  it('shows everything on reset', () => {
    expect(zoomWindow({ start: 30, end: 40 }, 'reset')).toEqual({ start: 0, end: 100 });
  });
});
