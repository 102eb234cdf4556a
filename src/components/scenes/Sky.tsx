/** The one place the scene islands mount the WebGL view. */
import { SkyView } from '../sphere/SkyView';
import type { SceneLike } from '../../lib/client/scene-view';
import type { CommentAnchor } from '../sphere/context';

export type PickedPoint = { ra: number; dec: number; azimuth: number; altitude: number };

export function Sky(props: { scene: SceneLike; edit?: boolean; onChange?: (s: SceneLike) => void; comments?: CommentAnchor[]; onPick?: (p: PickedPoint) => void; onSnapshot?: (url: string) => void; chrome?: 'full' | 'stage'; onTimeChange?: (ms: number) => void }) {
  return (
    <SkyView
      scene={props.scene as never}
      mode={props.edit ? 'edit' : 'view'}
      onSceneChange={props.onChange as never}
      comments={props.comments}
      onPickPoint={props.onPick}
      onSnapshot={props.onSnapshot}
      chrome={props.chrome}
      onTimeChange={props.onTimeChange}
    />
  );
}

/** Scales a snapshot down to a small PNG data URL for the scene's thumbnail. */
export async function shrinkPng(dataUrl: string, width = 480): Promise<string> {
  const img = new Image();
  img.src = dataUrl;
  await img.decode();
  const scale = Math.min(1, width / img.naturalWidth);
  const c = document.createElement('canvas');
  c.width = Math.round(img.naturalWidth * scale);
  c.height = Math.round(img.naturalHeight * scale);
  c.getContext('2d')!.drawImage(img, 0, 0, c.width, c.height);
  return c.toDataURL('image/png');
}
