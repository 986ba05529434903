import { notFound } from '@/lib/errors';
import { route } from '@/lib/http';

// Any /api path no route serves: 404 in the contract's JSON shape (not the HTML not-found page), for every method.
const handler = route(async () => {
  throw notFound('That API route');
});

export { handler as GET, handler as POST, handler as PUT, handler as PATCH, handler as DELETE };
