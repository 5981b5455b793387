import { readFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { Router } from 'express';
import { z } from 'zod';
import {
  IMPORT_LAYOUTS,
  IMPORT_MAX_BYTES,
  importKindSchema,
  importResultSchema,
  type ImportKind,
} from '../../shared/schemas/imports';
import type { Role } from '../../shared/schemas/user';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { MASTER_DATA_ROLES, READ_ROLES, SEQUENCE_ROLES } from '../http/roles';
import { FILE_FIELD, receiveFile } from '../http/upload';

const TEMPLATE_DIR = fileURLToPath(new URL('../../seed/templates/', import.meta.url));

/** Who may load each kind: master data and stock belong to buyers, the sequence to planners. */
const IMPORT_ROLES: Record<ImportKind, readonly Role[]> = {
  suppliers: MASTER_DATA_ROLES,
  parts: MASTER_DATA_ROLES,
  bom: MASTER_DATA_ROLES,
  schedule: SEQUENCE_ROLES,
  'on-hand': MASTER_DATA_ROLES,
  'open-orders': MASTER_DATA_ROLES,
};

const NOTES: Record<ImportKind, string> = {
  suppliers: 'upsert by code',
  parts:
    'upsert by part_number; optional extra columns hazardous and heavy_lift (true/false, yes/no, 1/0), un_number, hazard_class, sds_url, unit_weight_kg',
  bom: 'replaces every line of each parent named in the file; other parents keep their lines',
  schedule: 'upsert by serial; dates must be working days',
  'on-hand': 'sets the on-hand count of existing parts',
  'open-orders':
    'orders already open with suppliers: one confirmed release per supplier and reference, lines matched by part and due_date; they count as scheduled receipts and can be received at the dock',
};

/** CSV import routes and their templates. */
export function createImportsRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.imports;

  for (const kind of importKindSchema.options) {
    defineRoute(router, deps, {
      method: 'post',
      path: `/imports/${kind}`,
      summary:
        `Import ${kind} from a UTF-8 CSV sent as multipart/form-data field '${FILE_FIELD}' (at most ${IMPORT_MAX_BYTES / 1024 / 1024} MB), ` +
        `columns ${IMPORT_LAYOUTS[kind].columns.join(',')}; ${NOTES[kind]}. ` +
        'Any bad row → 422 with details [{row, column, message}] and nothing written.',
      access: IMPORT_ROLES[kind],
      response: importResultSchema,
      handler: async ({ req, res, user }) => {
        const upload = await receiveFile(req, res, { maxBytes: IMPORT_MAX_BYTES, what: 'the CSV' });
        return service.import({ kind, file: upload.buffer, fileName: upload.fileName, actorEmail: user.email });
      },
    });
  }

  defineRoute(router, deps, {
    method: 'get',
    path: '/imports/templates/:kind',
    summary: 'A CSV template with the header and example rows of one import kind',
    access: READ_ROLES,
    params: z.object({ kind: importKindSchema }),
    produces: ['text/csv'],
    handler: async ({ params, res }) => {
      const template = await readFile(`${TEMPLATE_DIR}${params.kind}.csv`);
      res.type('text/csv; charset=utf-8').attachment(`cardloop-${params.kind}-template.csv`).send(template);
      return undefined;
    },
  });

  return router;
}
