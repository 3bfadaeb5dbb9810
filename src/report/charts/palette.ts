/**
 * Series styles: colours from the Okabe–Ito palette (distinguishable with the common colour-vision
 * deficiencies; common practice) and two more, with a dash pattern and a marker shape per series so that series stay
 * apart on a grey-scale print too.
 */

export const COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000', '#8C564B', '#999933', '#882255'] as const;
export const DASHES = ['', '6 3', '2 3', '8 3 2 3'] as const;
export type Marker = 'circle' | 'square' | 'triangle' | 'diamond';
export const MARKERS: readonly Marker[] = ['circle', 'square', 'triangle', 'diamond'];

export interface SeriesStyle {
  colour: string;
  dash: string;
  marker: Marker;
}

export function seriesStyle(i: number): SeriesStyle {
  return {
    colour: COLOURS[i % COLOURS.length]!,
    dash: DASHES[i % DASHES.length]!,
    marker: MARKERS[i % MARKERS.length]!,
  };
}
