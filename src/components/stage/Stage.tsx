/**
 * The stage: what a room (or a follower of a live presentation) sees. Only the sky, the step's title and
 * caption, the site time, the step count and a few quiet controls that fade when the pointer rests.
 * The caption has its own band under the sky, so neither the sky's labels nor the controls can cover it;
 * its body text scales with the screen (24 px and more at 1920 px wide). Fits a phone without scrolling.
 */
import { useEffect, type ReactNode } from 'react';
import type { Step } from '../../lib/contracts/scene-doc';
import { formatInZone } from '../../lib/client/scene-view';
import { Markdown } from '../briefing/Markdown';
import { useIdle } from './useIdle';

export interface StageProps {
  /** The sky, drawn with `chrome="stage"`. */
  sky: ReactNode;
  step: Step | undefined;
  index: number;
  count: number;
  /** The instant shown (ISO, possibly easing toward the step's time). */
  time: string;
  timeZone: string;
  /** Buttons (← → leave, stop following, red light): shown while the pointer moves or a control has focus. */
  controls: ReactNode;
  /** Quiet status line (follow state, broadcast error). */
  status?: ReactNode;
  label: string;
  testId: string;
  onKeyDown?: (e: React.KeyboardEvent<HTMLDivElement>) => void;
  boxRef?: React.Ref<HTMLDivElement>;
}

export function Stage({ sky, step, index, count, time, timeZone, controls, status, label, testId, onKeyDown, boxRef }: StageProps) {
  const idle = useIdle(2500);
  useEffect(() => {
    // The page under the stage must not scroll (a phone's swipe would move it behind the room's view).
    const de = document.documentElement;
    const before = de.style.overflow;
    de.style.overflow = 'hidden';
    return () => {
      de.style.overflow = before;
    };
  }, []);
  return (
    <div
      ref={boxRef}
      tabIndex={-1}
      role="dialog"
      aria-modal="true"
      aria-label={label}
      data-testid={testId}
      className="fixed inset-0 z-50 flex flex-col overflow-hidden bg-[#05070d] text-ink-100 outline-none"
      onKeyDown={onKeyDown}
    >
      <div className="relative min-h-[42%] flex-1" data-testid="stage-sky">
        {sky}
      </div>
      <div className="grid shrink-0 grid-cols-1 gap-x-8 gap-y-2 border-t border-ink-800 bg-ink-950 px-[max(1rem,2.5vw)] py-[max(0.75rem,1.6vh)] md:grid-cols-[minmax(0,1fr)_auto]">
        <div key={step?.id ?? 'none'} className="min-w-0 animate-[armilla-fadein_400ms_ease-out] motion-reduce:animate-none" data-testid="stage-caption">
          <p className="text-[max(0.75rem,0.8vw)] uppercase tracking-[0.15em] text-brass-300" aria-live="polite">
            Step {index + 1} of {count}
            {step?.title ? ` · ${step.title}` : ''}
          </p>
          {step?.caption ? (
            <div className="armilla-caption mt-1 max-h-[30svh] overflow-y-auto text-[clamp(1rem,1.3vw,2.2rem)] md:max-h-[34svh]">
              <Markdown source={step.caption} />
            </div>
          ) : null}
        </div>
        <div className="flex flex-row flex-wrap items-end justify-between gap-x-4 gap-y-2 md:flex-col md:items-end md:justify-start md:text-right">
          <p className="font-mono text-[clamp(1rem,1.4vw,2rem)] tabular-nums" data-testid="stage-time">
            <span className="sr-only">Sky time at the site: </span>
            {formatInZone(time, timeZone)}
          </p>
          {status}
          <div
            className={`flex gap-2 transition-opacity duration-500 motion-reduce:transition-none focus-within:opacity-100 ${idle ? 'opacity-0' : 'opacity-100'}`}
            data-testid="stage-controls"
            data-idle={idle ? 'true' : 'false'}
          >
            {controls}
          </div>
        </div>
      </div>
    </div>
  );
}

export const STAGE_BUTTON =
  'inline-flex h-10 min-w-10 items-center justify-center rounded-md border border-ink-700 bg-ink-900/80 px-3 text-sm text-ink-100 hover:border-brass-300 hover:text-brass-200 disabled:opacity-40';
