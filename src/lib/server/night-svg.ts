/**
 * The night charts as standalone SVG files (downloads, the printed handout's source): the same React
 * components the workspace draws, rendered on the server with paper inks.
 */
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { AltitudeChart, type ChartComment } from '../../components/night/AltitudeChart';
import type { NightAnswer } from '../sky/night';

/** The chart with the comments pinned to it: numbered markers, each with its text as the marker's title. */
export function altitudeChartSvg(data: NightAnswer, timeZone: string, cursor: number | null, comments: ChartComment[] = []): string {
  const svg = renderToStaticMarkup(createElement(AltitudeChart, { data, timeZone, ink: 'print', fixedSize: true, width: 960, height: 440, cursor, comments, numbered: true }));
  return `<?xml version="1.0" encoding="UTF-8"?>\n${svg}\n`;
}

export function svgResponse(svg: string, filename: string): Response {
  return new Response(svg, {
    headers: {
      'content-type': 'image/svg+xml; charset=utf-8',
      'content-disposition': `attachment; filename="${filename.replace(/[^A-Za-z0-9._-]/g, '-')}"`,
      'cache-control': 'no-store',
    },
  });
}
