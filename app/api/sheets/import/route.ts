import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { importSheet } from '@/lib/db/revision-save';
import { MAX_DATASET_BODY_BYTES, json, notAllowed, readJson, route } from '@/lib/http';
import { AppError } from '@/lib/errors';
import { compareRecordedOutputs } from '@/lib/report/record';
import { requireValidDocument } from '@/lib/sheet/evaluation.server';
import { hashSheetDocument } from '@/lib/engine';
import { importSchema } from './schema';

export const POST = route(async (request) => {
  const user = await requireUser();
  const body = await readJson(request, importSchema, MAX_DATASET_BODY_BYTES);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: body.teamId, action: 'edit' });
  if (body.record) {
    const record = body.record;
    const document = requireValidDocument(record.document, 'record.document');
    const hash = hashSheetDocument(document);
    if (hash !== record.sheetHash) {
      throw new AppError('hash_mismatch', `record.document hashes to ${hash}, not to the record's sheetHash ${record.sheetHash}: the document was changed after export`, {
        field: 'record.sheetHash',
        extra: { computed: hash, recorded: record.sheetHash },
      });
    }
    const { sheet, revision, results } = await importSheet({ teamId, userId: user.id, document, datasets: record.datasets, message: 'Imported from a record' });
    const differences = compareRecordedOutputs(record.results, results);
    return json(
      {
        sheet,
        revision,
        verification: {
          hashMatches: true,
          outputsMatch: differences.length === 0,
          engine: { recorded: record.engine, computed: results.engine },
          differences,
        },
      },
      201,
    );
  }
  const { sheet, revision } =
    body.bundle
      ? await importSheet({ teamId, userId: user.id, document: body.bundle.document, datasets: body.bundle.datasets })
      : await importSheet({ teamId, userId: user.id, document: body.document });
  return json({ sheet, revision }, 201);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
