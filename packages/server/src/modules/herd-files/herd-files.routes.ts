import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import {
  herdExportQuerySchema, herdImportConfirmSchema, herdImportRowsQuerySchema, uuidParamSchema, type HerdImportStreamLine,
} from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import { acceptUpload, uploadedFiles } from '../../http/uploads';
import { AppError } from '../../lib/app-error';
import { errorBodyOf } from '../../http/error-handler';
import { assertCanImport, confirmHerdImport, exportHerdCsv, getHerdImport, hutchCards, pedigreeCertificate, stageHerdImport, type ImportLimits } from './herd-files.service';

const NDJSON = 'application/x-ndjson';

function limitsOf(config: Config): ImportLimits {
  return { maxRows: config.uploads.importMaxRows, maxWaiting: config.uploads.importsWaitingPerFarm };
}

/** Streams progress lines while the file is checked, then the result (or the refusal) as the last line. */
function progressStream(res: Response) {
  let started = false;
  const write = (line: HerdImportStreamLine) => {
    if (!started) {
      started = true;
      res.status(200);
      res.setHeader('Content-Type', `${NDJSON}; charset=utf-8`);
      res.setHeader('Cache-Control', 'no-store');
      res.setHeader('X-Accel-Buffering', 'no');
      res.flushHeaders();
    }
    res.write(`${JSON.stringify(line)}\n`);
  };
  return { write, get started() { return started; } };
}

async function stage(req: Request, res: Response, limits: ImportLimits) {
  const [file] = uploadedFiles(req);
  if (!file) throw AppError.validation({ file: ['Choose a CSV file to upload'] }, 'Choose a CSV file to upload');
  const input = { fileName: file.originalname, content: file.buffer };
  if (req.accepts(['application/json', NDJSON]) !== NDJSON) {
    res.status(201).json(await stageHerdImport(actorOf(req), input, limits));
    return;
  }
  // A browser asks for progress: the refusals known before checking starts keep their own status.
  const stream = progressStream(res);
  try {
    const dto = await stageHerdImport(actorOf(req), input, limits, (progress) => stream.write({ type: 'progress', ...progress }));
    stream.write({ type: 'result', status: 201, body: dto });
    res.end();
  } catch (error) {
    if (!stream.started) throw error;
    const { status, body } = errorBodyOf(error, req);
    stream.write({ type: 'error', status, body });
    res.end();
  }
}

/** /api/herd-imports: stage a spreadsheet (preview), page through its rows, confirm it. */
export function herdImportRoutes(config: Config): Router {
  const router = Router();
  const limits = limitsOf(config);
  router.use(requireUser);
  router.post(
    '/',
    (req, _res, next) => {
      // Who may import is settled before the file is read.
      assertCanImport(actorOf(req));
      next();
    },
    acceptUpload({ field: 'file', maxFiles: 1, maxBytes: config.uploads.importMaxBytes, noun: 'spreadsheet' }),
    async (req, res) => {
      await stage(req, res, limits);
    },
  );
  router.get('/:importId', async (req, res) => {
    res.json(await getHerdImport(actorOf(req), uuidParamSchema.parse(req.params.importId), herdImportRowsQuerySchema.parse(req.query)));
  });
  router.post('/:importId/confirmation', async (req, res) => {
    res.json(await confirmHerdImport(actorOf(req), uuidParamSchema.parse(req.params.importId), herdImportConfirmSchema.parse(req.body), limits));
  });
  return router;
}

/** /api/herd-export: the herd (with the Herd table's filters) as a CSV download. */
export function herdExportRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    const file = await exportHerdCsv(actorOf(req), herdExportQuerySchema.parse(req.query));
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('X-Row-Count', String(file.rows));
    res.send(file.body);
  });
  return router;
}

const hutchCardsQuerySchema = z.union([
  z.strictObject({ does: z.literal('breeding') }).transform(() => ({ does: true as const })),
  z.strictObject({
    animalIds: z.string().transform((text) => text.split(',').filter(Boolean)).pipe(z.array(z.uuid({ error: 'That animal was not found' })).min(1, 'Choose at least one animal')),
  }),
], { error: 'Choose the animals (animalIds) or every breeding doe (does=breeding)' });

/** /api/hutch-cards: printable hutch cards (PDF) of animals the viewer's farm keeps, with a QR code to each. */
export function hutchCardRoutes(config: Config): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/', async (req, res) => {
    const file = await hutchCards(actorOf(req), hutchCardsQuerySchema.parse(req.query), config.appUrl);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${file.fileName}"`);
    res.setHeader('Content-Length', String(file.body.length));
    res.setHeader('Cache-Control', 'no-store');
    res.send(file.body);
  });
  return router;
}

/** /api/pedigree-certificates/:animalId: the printable pedigree (PDF) of an animal of the viewer's farm. */
export function pedigreeCertificateRoutes(): Router {
  const router = Router();
  router.use(requireUser);
  router.get('/:animalId', async (req, res) => {
    const file = await pedigreeCertificate(actorOf(req), uuidParamSchema.parse(req.params.animalId));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
    res.setHeader('Content-Length', String(file.body.length));
    res.setHeader('Cache-Control', 'no-store');
    res.send(file.body);
  });
  return router;
}
