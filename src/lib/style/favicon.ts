/**
 * Armilla's icon: the horizon ring in its gold, the celestial equator tilted across it in its blue (the
 * palette's long dashes are dropped: at 16 px a dash is a pixel), and the Sun on the equator. Our own
 * drawing; `npm run favicon` writes public/favicon.svg and public/favicon.ico from it.
 */
import { BODIES, CIRCLES, SURFACE } from './palette';

export function faviconSvg(): string {
  return [
    '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 32 32">',
    `<rect width="32" height="32" rx="7" fill="${SURFACE.panel.screen}"/>`,
    `<ellipse cx="16" cy="16" rx="12" ry="5" fill="none" stroke="${CIRCLES.equator.screen}" stroke-width="2.4" transform="rotate(-32 16 16)"/>`,
    `<circle cx="16" cy="16" r="12" fill="none" stroke="${CIRCLES.horizon.screen}" stroke-width="2.6"/>`,
    `<circle cx="24.3" cy="11.1" r="3.2" fill="${BODIES.sun.screen}" stroke="${SURFACE.panel.screen}" stroke-width="1"/>`,
    '</svg>',
  ].join('');
}
