import type { EChartsCoreOption, EChartsType } from 'echarts/core';
import { loadTroplineEcharts } from '../api/tropline-echarts';

/** A chart's numbers as a table: the accessible alternative and the CSV export. */
export interface ChartTable {
  /** What the table shows, e.g. "Values of every level over time". */
  readonly caption: string;
  /** Column headings, units included. */
  readonly columns: readonly string[];
  /** Rows of cells; numbers stay numbers so each consumer formats them its own way. */
  readonly rows: readonly (readonly (number | string | null)[])[];
}

/** One CSV field (RFC 4180): quoted when it holds a comma, quote or line break. */
function csvField(value: number | string | null): string {
  if (value === null) return '';
  const text = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The table as CSV (RFC 4180, CRLF line ends, full-precision numbers, no locale). */
export function tableCsv(table: ChartTable): string {
  return [table.columns, ...table.rows].map((row) => row.map(csvField).join(',')).join('\r\n');
}

/** Renders an option to an SVG document off-screen (ECharts' server-side SVG renderer). */
export async function optionSvg(
  option: EChartsCoreOption,
  width: number,
  height: number,
): Promise<string> {
  const echarts = await loadTroplineEcharts();
  const chart = echarts.init(null, null, {
    renderer: 'svg',
    ssr: true,
    width: Math.max(320, width),
    height: Math.max(200, height),
  });
  chart.setOption({ ...option, animation: false });
  const svg = chart.renderToSVGString();
  chart.dispose();
  return svg;
}

/** A PNG of the chart as drawn, at twice its size, on the given background. */
export function chartPng(chart: EChartsType, background: string): string {
  return chart.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: background });
}

/** Offers a file to the reader (an anchor click; no inline script, no new window). */
export function saveFile(doc: Document, name: string, content: Blob | string): void {
  const url =
    typeof content === 'string' && content.startsWith('data:')
      ? content
      : URL.createObjectURL(content instanceof Blob ? content : new Blob([content]));
  const anchor = doc.createElement('a');
  anchor.href = url;
  anchor.download = name;
  anchor.style.display = 'none';
  doc.body.appendChild(anchor);
  anchor.click();
  anchor.remove();
  if (url.startsWith('blob:')) setTimeout(() => URL.revokeObjectURL(url), 0);
}
