import { notAllowed, route } from '@/lib/http';
import { publishedCatalog } from '@/lib/sheet/catalog.server';

// The block-type catalog for the sheet workspace (types, inputs, units, help; plain data of the product,
// nothing of any user or team, so no sign-in is needed). The sheet page names the version it was rendered
// with (`?v=`): that answer never changes and is cached for a year; any other (or none) is the current
// catalog, not to be cached, with its version in `Denudata-Catalog-Version`.
export const GET = route(async (request) => {
  const { version, body } = publishedCatalog();
  const asked = new URL(request.url).searchParams.get('v');
  return new Response(body, {
    headers: {
      'content-type': 'application/json',
      'cache-control': asked === version ? 'public, max-age=31536000, immutable' : 'no-cache',
      'denudata-catalog-version': version,
    },
  });
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
