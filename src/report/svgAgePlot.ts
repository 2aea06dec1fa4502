/** Clock error against age of data: one curve per satellite (or system), age in hours on x. */
import { linePlot } from './svgLinePlot.ts';

/** One curve: ages [s] and errors [ns]. */
export interface AgeCurve {
  label: string;
  ageS: ArrayLike<number>;
  errorNs: ArrayLike<number>;
}

/** Line plot of error [ns] against age of data [h]; markers when a curve has few points. */
export function ageErrorPlot(title: string, curves: readonly AgeCurve[], yLabel = 'expected clock error'): string {
  return linePlot({
    title,
    xAxis: { label: 'age of data', unit: 'h' },
    yAxis: { label: yLabel, unit: 'ns' },
    series: curves.map((c) => ({
      label: c.label,
      x: Array.from(c.ageS, (s) => s / 3600),
      y: Array.from(c.errorNs),
      markers: c.ageS.length <= 30,
    })),
  });
}
