/**
 * Axis line, ticks and grid lines drawn in the theme's text colour, the grid faint: ECharts'
 * own greys are made for light surfaces and glare on dark ones.
 */
export function axisStyle(text: string) {
  return {
    axisLine: { lineStyle: { color: text, opacity: 0.6 } },
    axisTick: { lineStyle: { color: text, opacity: 0.6 } },
    splitLine: { lineStyle: { color: text, opacity: 0.14 } },
  };
}
