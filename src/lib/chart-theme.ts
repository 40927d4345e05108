// The colours and nivo theme shared by the line charts (conditions, sea-data series).

/** The charts' colours in the light or the dark theme: text, grid line, ink, the "now" marker, the tooltip's surface. */
export function chartPalette(dark: boolean) {
  return dark
    ? { text: '#9fb4bc', line: '#24485a', ink: '#e6eef0', now: '#f2c46d', surface: '#16303d' }
    : { text: '#4a5d66', line: '#cfd9d8', ink: '#10222c', now: '#b7791f', surface: '#ffffff' };
}

export type ChartPalette = ReturnType<typeof chartPalette>;

/** A nivo line chart's theme in that palette: 11 px text, thin axes, grid lines at `gridOpacity`. */
export function nivoLineTheme(palette: ChartPalette, gridOpacity: number) {
  return {
    text: { fill: palette.text, fontSize: 11, fontFamily: 'inherit' },
    axis: {
      domain: { line: { stroke: palette.line, strokeWidth: 1 } },
      ticks: { line: { stroke: palette.line, strokeWidth: 1 }, text: { fill: palette.text, fontSize: 11 } },
    },
    grid: { line: { stroke: palette.line, strokeWidth: 1, strokeOpacity: gridOpacity } },
    crosshair: { line: { stroke: palette.ink, strokeWidth: 1, strokeOpacity: 0.5 } },
  };
}
