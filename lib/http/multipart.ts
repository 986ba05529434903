import 'server-only';
import { AppError } from '@/lib/errors';

/** The whole multipart body of an upload may be up to 2.5 MiB (CONTRACT §7.3). */
export const MAX_UPLOAD_BODY_BYTES = 2.5 * 1024 * 1024;

const tooLarge = (message: string) => new AppError('too_large', message);

/**
 * Reads a multipart/form-data body of at most `maxBytes` (413 as soon as the declared length or the bytes
 * read pass it, so an oversized body is never buffered whole) and parses it: 415 for another content type.
 */
export async function readMultipart(request: Request, maxBytes = MAX_UPLOAD_BODY_BYTES): Promise<FormData> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data\s*;/i.test(type)) {
    throw new AppError('unsupported_media_type', 'Send the upload as multipart/form-data (a form with the file).');
  }
  const declared = Number(request.headers.get('content-length') ?? '');
  const limitText = `${(maxBytes / 1024 / 1024).toFixed(1)} MiB`;
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(`The upload is larger than ${limitText}.`);
  const chunks: Uint8Array[] = [];
  let size = 0;
  if (request.body) {
    const reader = request.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      size += value.byteLength;
      if (size > maxBytes) {
        await reader.cancel().catch(() => undefined);
        throw tooLarge(`The upload is larger than ${limitText}.`);
      }
      chunks.push(value);
    }
  }
  try {
    return await new Response(Buffer.concat(chunks), { headers: { 'content-type': type } }).formData();
  } catch {
    throw new AppError('validation', 'The request body is not a readable multipart form.');
  }
}
