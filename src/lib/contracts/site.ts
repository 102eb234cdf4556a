/** Saved sites of a team: request bodies and the answer (API contract "Sites"). */
import { z } from 'zod';
import { knownKeysOnly } from './known-keys';
import { siteSchema, type Site } from './scene-doc';

const siteCreateShape = siteSchema;
export const siteCreateSchema = knownKeysOnly(siteCreateShape, siteCreateShape);
const sitePatchShape = z.object({
  name: siteSchema.shape.name.optional(),
  lat: siteSchema.shape.lat.optional(),
  lon: siteSchema.shape.lon.optional(),
  height: siteSchema.shape.height.removeDefault().optional(),
  timeZone: siteSchema.shape.timeZone.removeDefault().optional(),
});
export const sitePatchSchema = knownKeysOnly(sitePatchShape, sitePatchShape);


export interface SiteOut extends Site {
  id: string;
  teamId: string;
}
