import { db } from '../../../../../lib/server/db';
import { HttpError, route } from '../../../../../lib/server/http';
import { resolveLink } from '../../../../../lib/server/links';
import { presenterStream, readPresenter } from '../../../../../lib/server/presenter';

/** Follow the presenter through a link (either role); the stream ends when the link is revoked or expires. */
export const GET = route(async ({ params, request }) => {
  const token = params.token!;
  const { scene } = await resolveLink(db, token, true);
  return presenterStream(async () => {
    try {
      await resolveLink(db, token);
    } catch (e) {
      if (e instanceof HttpError && e.status === 404) return 'gone';
      throw e;
    }
    return readPresenter(db, scene.id);
  }, request.signal);
});
