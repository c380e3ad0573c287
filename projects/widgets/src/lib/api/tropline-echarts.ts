import type * as EChartsCore from 'echarts/core';

/** The ECharts core module, as ngx-echarts expects it. */
export type TroplineEcharts = typeof EChartsCore;

/**
 * Loads Tropline's trimmed ECharts build on first use, so ECharts stays out of a host page's
 * initial JavaScript.
 */
export function loadTroplineEcharts(): Promise<TroplineEcharts> {
  return import('./tropline-echarts-build').then((m) => m.troplineEchartsBuild);
}
