/** Shared, non-reactive handles of one SkyView: the model, the clock, the UI store and the camera state. */
import { createContext, useContext } from 'react';
import type { Layers } from '../../lib/contracts/scene-doc';
import type { SkyModel } from './model';
import type { Clock, Store } from './store';
import type { PointReadout } from './sky-adapter';

export type ViewMode = 'observer' | 'sphere';

export type Selection =
  | { kind: 'star'; index: number }
  | { kind: 'body'; body: string }
  | { kind: 'target'; id: string };

export interface CommentAnchor {
  id: string;
  label?: string;
  ra?: number;
  dec?: number;
  azimuth?: number;
  altitude?: number;
  resolved?: boolean;
}

export interface PinLike {
  id: string;
  kind: 'label' | 'arrow' | 'arc' | 'region';
  frame: 'horizontal' | 'equatorial';
  points: [number, number][];
  label?: string;
  color?: string;
}

export interface UiState {
  mode: ViewMode;
  layers: Required<Layers>;
  selected: Selection | null;
  playing: boolean;
  rate: number;
  /** Bumped when the catalogue arrives, so layers re-read it. */
  catalogueReady: boolean;
  pins: PinLike[];
  comments: CommentAnchor[];
}

export interface CamState {
  /** Observer view: direction looked at, field of view. */
  az: number;
  alt: number;
  fov: number;
  /** 0 = Observer view, 1 = Sphere view; animated between. */
  t: number;
  sphereFov: number;
  sphereDist: number;
}

export interface Hud {
  readout: ((r: PointReadout | null) => void) | null;
  snapshot: (() => Promise<string>) | null;
  invalidate: (() => void) | null;
  /** Sphere view: turn the camera about the sphere (degrees) and scale its distance. */
  orbit: ((dAzDeg: number, dAltDeg: number, zoom: number) => void) | null;
  overlay: HTMLCanvasElement | null;
}

export interface ViewHandles {
  model: SkyModel;
  clock: Clock;
  store: Store<UiState>;
  cam: CamState;
  hud: Hud;
  siteName: string;
  timeZone: string;
}

export const ViewContext = createContext<ViewHandles | null>(null);

export function useView(): ViewHandles {
  const v = useContext(ViewContext);
  if (!v) throw new Error('SkyView context missing');
  return v;
}
