import { Router, type Request, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import { ProblemError, validationProblem } from '../http/problem';
import { actorOf, type ScenarioGuard } from '../scenarios/scenario-access';
import { intParam } from '../scenarios/scenarios-routes';
import type { DatasetsService } from './datasets-service';

/** Largest survey file accepted: 512 KiB (2000 rows of five levels with errors fit easily). */
export const MAX_UPLOAD_BYTES = 512 * 1024;

/** Runs multer for one file in memory and turns its errors into problems naming the field. */
function receiveFile(maxBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 5, fieldSize: 2000 },
  }).single('file');
  return (req: Request, res: Response, next) => {
    upload(req, res, (err?: unknown) => {
      if (!err) return next();
      const e = err as { code?: string; field?: string; message?: string };
      if (e.code === 'LIMIT_FILE_SIZE') {
        return next(
          new ProblemError(
            413,
            'body-too-large',
            'The file is too large',
            `Survey files may be at most ${maxBytes} bytes. Nothing was stored.`,
            {
              limit: maxBytes,
              errors: [{ pointer: '/file', message: `larger than ${maxBytes} bytes` }],
            },
          ),
        );
      }
      next(
        validationProblem([
          { pointer: `/${e.field ?? 'file'}`, message: e.message ?? 'unreadable multipart upload' },
        ]),
      );
    });
  };
}

/**
 * `POST /scenarios/{id}/datasets` (multipart: `file`, optional `changeNote`, optional
 * `scenarioVersion` the file is made for, default the latest), the list, one version's parsed
 * series, and `…/csv` to download the upload unchanged.
 */
export function datasetsRoutes(
  service: DatasetsService,
  guard: ScenarioGuard,
  maxBytes = MAX_UPLOAD_BYTES,
): Router {
  const router = Router();
  const read = guard({ action: 'data:read', scope: 'scenarios:read' });
  const write = guard({ action: 'data:write', scope: 'scenarios:write' });
  const id = (req: Request) => String(req.params.id);

  router.post('/scenarios/:id/datasets', write, receiveFile(maxBytes), async (req, res) => {
    if (!req.file) {
      throw validationProblem([
        { pointer: '/file', message: 'send the survey CSV as the multipart field "file"' },
      ]);
    }
    const note = typeof req.body?.changeNote === 'string' ? req.body.changeNote.trim() : '';
    const raw = req.body?.scenarioVersion as unknown;
    if (raw !== undefined && (typeof raw !== 'string' || !/^[1-9][0-9]{0,8}$/.test(raw))) {
      throw validationProblem([
        {
          pointer: '/scenarioVersion',
          message: `scenarioVersion must be a version number (1, 2, …), not "${String(raw)}"`,
        },
      ]);
    }
    const stored = await service.upload(actorOf(req), id(req), {
      file: req.file.buffer,
      filename: req.file.originalname || 'survey.csv',
      note: note || 'Survey upload',
      ...(raw === undefined ? {} : { scenarioVersion: Number(raw) }),
    });
    res
      .status(201)
      .location(`/api/v1/scenarios/${id(req)}/datasets/${stored.version}`)
      .json(stored);
  });

  router.get('/scenarios/:id/datasets', read, async (req, res) => {
    res.json({ datasets: await service.list(actorOf(req), id(req)) });
  });

  router.get('/scenarios/:id/datasets/:version', read, async (req, res) => {
    res.json(await service.get(actorOf(req), id(req), intParam(req, 'version')));
  });

  router.get('/scenarios/:id/datasets/:version/csv', read, async (req, res) => {
    const file = await service.original(actorOf(req), id(req), intParam(req, 'version'));
    const safe = file.filename.replace(/[^\w.-]+/g, '_');
    res
      .status(200)
      .set('Content-Type', 'text/csv; charset=utf-8')
      .set('Content-Disposition', `attachment; filename="${safe}"`)
      .send(file.bytes);
  });
  return router;
}
