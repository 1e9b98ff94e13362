/** What the browser benchmark runs inside Chromium: the app's own store and chart code. */

export { openRepository } from '../../src/store/repository';
export { decimate, mergeSeries } from '../../src/ui/charts/chart-data';
export { createTimeChart } from '../../src/ui/charts/time-chart';
