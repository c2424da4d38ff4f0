import { Router, type Request, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import type { z } from 'zod';
import { AppError, PayloadTooLargeError, UnsupportedMediaTypeError, ValidationError } from '../errors';
import { currentUser, requireSession } from '../middleware/require-session';
import { fieldErrors, parseParams, validateBody } from '../middleware/validate';
import type { StoredSnapshot } from '../repositories/view-repository';
import { projectIdParams } from '../schemas/projects';
import { archiveViewBody, createViewBody, listViewsQuery, saveViewBody, saveViewChangesBody, shareByMailBody, updateViewBody, viewIdParams } from '../schemas/views';
import { SNAPSHOT_CONTENT_TYPE, SNAPSHOT_MAX_BYTES } from '../../workers/io/snapshot-format';
import { runAfterAnswer } from '../services/notification-service';
import type { ViewSaveService } from '../services/view-save-service';
import { ViewService } from '../services/view-service';

/** Parses the query string with a zod schema, or answers 400 naming each bad parameter. */
export function parseQuery<S extends z.ZodType>(schema: S, query: unknown): z.infer<S> {
  const result = schema.safeParse(query ?? {});
  if (!result.success) throw new ValidationError(fieldErrors(result.error), 'Some query parameters are not valid.');
  return result.data;
}

const MB = SNAPSHOT_MAX_BYTES / (1024 * 1024);
const bareType = (t: string) => t.split(';')[0].trim().toLowerCase();

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: SNAPSHOT_MAX_BYTES, files: 1, fields: 0 },
  fileFilter: (_req, file, cb) => {
    if (file.fieldname === 'snapshot' && bareType(file.mimetype) !== SNAPSHOT_CONTENT_TYPE) {
      return cb(new UnsupportedMediaTypeError(`A snapshot is sent as ${SNAPSHOT_CONTENT_TYPE}, not ${file.mimetype || 'an untyped file'}.`));
    }
    cb(null, true);
  },
}).single('snapshot');

/** multer's errors carry no HTTP status: each becomes one in the error shape. */
function uploadError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') return new PayloadTooLargeError(`A snapshot file may be at most ${MB} MB.`);
    if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') {
      return new ValidationError({ snapshot: 'Send one file, in the form field "snapshot".' }, 'Unexpected file in the upload.');
    }
    return new ValidationError({ snapshot: `Send only the file, in the form field "snapshot" (${err.message}).` }, 'The upload has parts it should not.');
  }
  return new ValidationError({ snapshot: 'The upload could not be read as multipart/form-data.' }, 'The upload could not be read.');
}

/** A whole view: the JSON form field `view` and the file field `snapshot` (multipart/form-data). */
const viewParts = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: SNAPSHOT_MAX_BYTES, files: 1, fields: 1, fieldSize: 2 * 1024 * 1024 },
  fileFilter: (_req, file, cb) => {
    if (file.fieldname === 'snapshot' && bareType(file.mimetype) !== SNAPSHOT_CONTENT_TYPE) {
      return cb(new UnsupportedMediaTypeError(`A snapshot is sent as ${SNAPSHOT_CONTENT_TYPE}, not ${file.mimetype || 'an untyped file'}.`));
    }
    cb(null, true);
  },
}).single('snapshot');

/** Only multipart requests take the whole-view routes; a JSON request goes on to the plain route. */
const onlyMultipart: RequestHandler = (req, _res, next) => next(req.is('multipart/form-data') ? undefined : 'route');

/** Reads the parts and parses the `view` field as JSON with `schema`, naming each bad field. */
function receiveViewParts<S extends z.ZodType>(schema: S): RequestHandler {
  return (req, res, next) => {
    viewParts(req, res, (err?: unknown) => {
      if (err) return next(uploadError(err));
      const text = (req.body as { view?: unknown } | undefined)?.view;
      if (typeof text !== 'string') return next(new ValidationError({ view: 'Send the view as JSON in the form field "view".' }));
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch {
        return next(new ValidationError({ view: 'The form field "view" is not valid JSON.' }));
      }
      const parsed = schema.safeParse(json);
      if (!parsed.success) return next(new ValidationError(fieldErrors(parsed.error)));
      req.body = parsed.data;
      next();
    });
  };
}

const receiveSnapshot: RequestHandler = (req, res, next) => {
  if (!req.is('multipart/form-data')) {
    return next(new UnsupportedMediaTypeError(`Send the snapshot as multipart/form-data, in the field "snapshot" of type ${SNAPSHOT_CONTENT_TYPE}.`));
  }
  upload(req, res, (err?: unknown) => next(err ? uploadError(err) : undefined));
};

/**
 * Answers with a stored snapshot: the gzip bytes as they are kept, with Content-Encoding: gzip (every
 * browser takes it); decompressed only for a client that says it cannot.
 */
export async function sendSnapshot(req: Request, res: Response, snapshot: StoredSnapshot): Promise<void> {
  res.set('Cache-Control', 'private, no-cache');
  res.set('Vary', 'Accept-Encoding');
  res.type(SNAPSHOT_CONTENT_TYPE);
  if (req.acceptsEncodings('gzip')) {
    res.set('Content-Encoding', 'gzip');
    res.send(snapshot.gzip);
  } else {
    res.send(await ViewService.gunzip(snapshot));
  }
}

/** Saved views and their snapshots. The role each needs is checked in ViewService (404 non-member, 403 low role). */
export function viewRoutes(views: ViewService, saves: ViewSaveService): Router {
  const router = Router();

  // A view saved whole (state, snapshot and marks in one transaction). Registered before the JSON routes of
  // the same paths: a request that is not multipart passes on to those.
  router.post(
    '/projects/:id/views',
    requireSession,
    onlyMultipart,
    async (req, _res, next) => {
      await saves.mayCreate(currentUser(req), parseParams(projectIdParams, req.params).id); // before a byte is read
      next();
    },
    receiveViewParts(saveViewBody),
    async (req, res) => {
      const { id } = parseParams(projectIdParams, req.params);
      const { view, marks, followUp } = await saves.saveNew(currentUser(req), id, req.body, req.file);
      res.status(201).json({ view, marks });
      runAfterAnswer(followUp);
    },
  );

  router.patch(
    '/views/:id',
    requireSession,
    onlyMultipart,
    async (req, _res, next) => {
      await views.mayUploadSnapshot(currentUser(req), parseParams(viewIdParams, req.params).id);
      next();
    },
    receiveViewParts(saveViewChangesBody),
    async (req, res) => {
      const { id } = parseParams(viewIdParams, req.params);
      const { view, marks, followUp } = await saves.saveChanges(currentUser(req), id, req.body, req.file);
      res.json({ view, marks });
      runAfterAnswer(followUp);
    },
  );

  router.get('/projects/:id/views', requireSession, async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    const query = parseQuery(listViewsQuery, req.query);
    res.json(await views.list(currentUser(req), id, query));
  });

  router.post('/projects/:id/views', requireSession, validateBody(createViewBody), async (req, res) => {
    const { id } = parseParams(projectIdParams, req.params);
    res.status(201).json({ view: await views.create(currentUser(req), id, req.body) });
  });

  router.get('/views/:id', requireSession, async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    res.json({ view: await views.get(currentUser(req), id) });
  });

  router.patch('/views/:id', requireSession, validateBody(updateViewBody), async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    res.json({ view: await views.update(currentUser(req), id, req.body) });
  });

  router.delete('/views/:id', requireSession, async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    await views.remove(currentUser(req), id);
    res.status(204).end();
  });

  router.post('/views/:id/archive', requireSession, validateBody(archiveViewBody), async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    res.json({ view: await views.setArchived(currentUser(req), id, req.body.archived) });
  });

  router.put(
    '/views/:id/snapshot',
    requireSession,
    // the role is checked before a byte of the file is read
    async (req, _res, next) => {
      const { id } = parseParams(viewIdParams, req.params);
      await views.mayUploadSnapshot(currentUser(req), id);
      next();
    },
    receiveSnapshot,
    async (req, res) => {
      const { id } = parseParams(viewIdParams, req.params);
      const { snapshot } = await views.putSnapshot(currentUser(req), id, req.file);
      res.json({ snapshot });
    },
  );

  router.get('/views/:id/snapshot', requireSession, async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    await sendSnapshot(req, res, await views.getSnapshot(currentUser(req), id));
  });

  router.post('/views/:id/share', requireSession, validateBody(shareByMailBody), async (req, res) => {
    const { id } = parseParams(viewIdParams, req.params);
    const { sharedWith, followUp } = await views.shareByMail(currentUser(req), id, req.body.email);
    res.status(202).json({ sharedWith });
    runAfterAnswer(followUp);
  });

  return router;
}
