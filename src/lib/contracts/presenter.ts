/** The presenter's position in a briefing: request body and the answer (API contract "Presenter"). */
import { z } from 'zod';
import { knownKeysOnly } from './known-keys';
import { isoUtc } from './scene-doc';
import { MAX_STEPS } from './scene';

const presenterShape = z.object({
  stepIndex: z.number({ required_error: 'is required' }).int().min(0).max(MAX_STEPS - 1),
  time: isoUtc.nullable().optional(),
});
export const presenterSchema = knownKeysOnly(presenterShape, presenterShape);

export interface PresenterOut {
  sceneId: string;
  stepIndex: number;
  stepId: string | null;
  time: string | null;
  updatedAt: string;
}
