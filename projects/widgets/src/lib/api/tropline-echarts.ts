import { LineChart, ScatterChart } from 'echarts/charts';
import {
  AriaComponent,
  DataZoomComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  TitleComponent,
  TooltipComponent,
} from 'echarts/components';
import * as echarts from 'echarts/core';
import { CanvasRenderer, SVGRenderer } from 'echarts/renderers';

// Only what the widgets draw (SVG as well as canvas: crisper in print and testable without a
// canvas): a trimmed build keeps a host page's bundle small. AriaComponent is
// needed for the generated chart descriptions that screen readers announce.
echarts.use([
  LineChart,
  ScatterChart,
  AriaComponent,
  DataZoomComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  TitleComponent,
  TooltipComponent,
  CanvasRenderer,
  SVGRenderer,
]);

/** The ECharts core with the charts and components the widgets use registered. */
export const troplineEcharts = echarts;
