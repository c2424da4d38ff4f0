// What other features take from the Bench: its uPlot chart, for plots drawn the same way (campaign Trends).
export { plotAxis, UPlotChart } from './components/uplot-chart';
