import type { ChartData } from 'chart.js';
import type { DevicePoint } from '@shared/schemas/devices';
import { brandColours } from '@shared/palette';

type Point = { x: number; y: number };

/** The hydrometer's colour on the gravity chart: the palette's blue, apart from the hand readings' honey and grey and the finish's green. */
export const DEVICE_SERIES_COLOUR = brandColours.info;

/**
 * The device readings as one chart series: a thin line without markers (there can be hundreds
 * of points), marked "Hydrometer" in the legend and tooltip. Empty when there are none.
 * @param dayOf - the chart's x for a moment (days since the start)
 */
export function deviceDatasets(points: DevicePoint[], dayOf: (iso: string) => number): ChartData<'line', Point[]>['datasets'] {
  if (points.length === 0) return [];
  return [
    {
      label: 'Hydrometer',
      data: points.map((p) => ({ x: dayOf(p.at), y: p.sg })),
      borderColor: DEVICE_SERIES_COLOUR,
      backgroundColor: DEVICE_SERIES_COLOUR,
      borderWidth: 1.5,
      pointRadius: 0,
      pointHitRadius: 6,
      tension: 0,
    },
  ];
}
