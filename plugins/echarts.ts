// Registers only the ECharts pieces the product draws (keeps the client chunk small).
import { use } from 'echarts/core'
import { BarChart, CustomChart, HeatmapChart, LineChart, MapChart, ScatterChart } from 'echarts/charts'
import { DataZoomComponent, GeoComponent, GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TitleComponent, TooltipComponent, VisualMapComponent } from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'

use([
  BarChart, CustomChart, HeatmapChart, LineChart, MapChart, ScatterChart,
  DataZoomComponent, GeoComponent, GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent,
  TitleComponent, TooltipComponent, VisualMapComponent, CanvasRenderer,
])

export default defineNuxtPlugin(() => {})
