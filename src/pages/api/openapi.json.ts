/** GET /api/openapi.json (fixed) — the OpenAPI 3.1 document of every route a token can reach, built once per process. */
import { jsonText, route } from '../../lib/server/http';
import { openApi } from '../../lib/server/openapi/document';

/** It changes only with a new release: caches may keep it an hour and then ask again with the ETag. */
const CACHE = 'public, max-age=3600, must-revalidate';

export const GET = route(({ request }) => {
  const { text, etag } = openApi();
  if (request.headers.get('if-none-match') === etag) {
    return new Response(null, { status: 304, headers: { etag, 'cache-control': CACHE } });
  }
  return jsonText(text, 200, { etag, 'cache-control': CACHE, 'access-control-allow-origin': '*' });
});
