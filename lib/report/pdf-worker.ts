/**
 * The PDF worker: lays out a report's PDF in a worker thread (piscina), so the layout (about a second of
 * CPU for a large sheet) never holds up the server's other requests. Bundled to plain JavaScript by
 * scripts/build-worker.mjs (Node 20 workers cannot load TypeScript); @react-pdf/renderer and React stay
 * external and load from node_modules.
 */
import type { ReportModel } from './types';
import { renderReportPdf } from './pdf';

export default async function renderReportTask({ model }: { model: ReportModel }): Promise<Uint8Array> {
  const bytes = await renderReportPdf(model);
  // A copy that owns its own memory, so it can be transferred back without copying again.
  return new Uint8Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
}
