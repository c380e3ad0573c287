import { optionSvg, tableCsv } from './chart-export';

describe('tableCsv', () => {
  it('writes headings and rows with CRLF, quoting only where needed', () => {
    const csv = tableCsv({
      caption: 'x',
      columns: ['time (week)', 'Algae, green (g C m⁻²)'],
      rows: [
        [0, 0.5],
        [1, null],
        ['say "hi"', Number.NaN],
      ],
    });
    expect(csv).toBe('time (week),"Algae, green (g C m⁻²)"\r\n0,0.5\r\n1,\r\n"say ""hi""",');
  });

  it('keeps full precision and ignores the locale', () => {
    const csv = tableCsv({ caption: 'x', columns: ['v'], rows: [[1234567.891234]] });
    expect(csv).toBe('v\r\n1234567.891234');
  });
});

describe('optionSvg', () => {
  it('renders an option to a standalone SVG document', async () => {
    const svg = await optionSvg(
      {
        xAxis: { type: 'value' },
        yAxis: { type: 'value' },
        series: [
          {
            type: 'line',
            data: [
              [0, 1],
              [1, 2],
            ],
          },
        ],
      },
      400,
      300,
    );
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('width="400"');
    expect(svg).toContain('<path');
  });
});
