/**
 * ECharts as the app uses it: the tree-shakable core with only the charts and components our
 * charts draw, registered once. Import `echarts` and `ReactECharts` from here, never from
 * 'echarts' or 'echarts-for-react' directly (those pull in the whole library); option types may
 * still come from 'echarts' as `import type`.
 */
import * as echarts from 'echarts/core';
import { BarChart, BoxplotChart, LineChart, ScatterChart } from 'echarts/charts';
import { AriaComponent, DataZoomComponent, GridComponent, LegendComponent, MarkLineComponent, TooltipComponent } from 'echarts/components';
import { CanvasRenderer, SVGRenderer } from 'echarts/renderers';
import ReactEChartsCore from 'echarts-for-react/esm/core';
import type { EChartsReactProps } from 'echarts-for-react/esm/types';

echarts.use([LineChart, BarChart, ScatterChart, BoxplotChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, MarkLineComponent, AriaComponent, CanvasRenderer, SVGRenderer]);

export { echarts };

/**
 * `echarts-for-react` bound to the trimmed core above (what its default export does with the whole
 * library). A class, so `useRef<ReactECharts>` and `getEchartsInstance()` work as before.
 */
export class ReactECharts extends ReactEChartsCore {
  constructor(props: EChartsReactProps) {
    super(props);
    this.echarts = echarts;
  }
}
