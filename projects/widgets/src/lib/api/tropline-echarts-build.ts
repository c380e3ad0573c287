import { LineChart, ScatterChart } from 'echarts/charts';
import {
  AriaComponent,
  DataZoomComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
} from 'echarts/components';
import * as echarts from 'echarts/core';
import { CanvasRenderer, SVGRenderer } from 'echarts/renderers';

// Only what the widgets draw (SVG as well as canvas: crisper in print, testable without a
// canvas, and what the SVG export uses). AriaComponent is needed for the generated chart
// descriptions and decal patterns. Loaded only through loadTroplineEcharts().
echarts.use([
  LineChart,
  ScatterChart,
  AriaComponent,
  DataZoomComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  MarkLineComponent,
  TitleComponent,
  TooltipComponent,
  CanvasRenderer,
  SVGRenderer,
]);

/** The ECharts core with the widgets' charts and components registered. */
export const troplineEchartsBuild = echarts;
