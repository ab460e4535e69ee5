import { Router, type RequestHandler } from 'express';
import type { z } from 'zod';
import { editMessageSchema, historyQuerySchema, messageParamsSchema, postMessageSchema, roomParamsSchema, type HistoryQuery } from '@shared/schemas/chat';
import { swapParamsSchema } from '@shared/schemas/live';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { photoUploadMiddleware, receivedFiles } from '../uploads/photo-pipeline';
import type { AppDeps } from '../deps';
import { authorizeRoom, type RoomAccess } from './chat.policy';
import { roomDto, swapRoom } from './chat-rooms.service';
import * as chat from './chat.service';

type RoomParams = z.infer<typeof roomParamsSchema>;
type MessageParams = z.infer<typeof messageParamsSchema>;

/** Chat: rooms, history and messages over REST; the live part broadcasts every change to the room. */
export function chatRouter(deps: AppDeps) {
  const router = Router();
  const upload = photoUploadMiddleware();
  // A message with photos comes as multipart/form-data (field `photos`, caption in `body`); text alone as JSON.
  const photosIfAny: RequestHandler = (req, res, next) => (req.is('multipart/form-data') ? upload(req, res, next) : next());

  router.get('/chat/rooms/:roomId', requireUser, validate({ params: roomParamsSchema }), async (req, res) => {
    const { roomId } = req.params as unknown as RoomParams;
    const userId = currentUser(req).id;
    res.json(await roomDto(await authorizeRoom(userId, roomId), userId));
  });

  router.get('/chat/rooms/:roomId/messages', requireUser, validate({ params: roomParamsSchema, query: historyQuerySchema }), async (req, res) => {
    const { roomId } = req.params as unknown as RoomParams;
    await authorizeRoom(currentUser(req).id, roomId);
    res.json(await chat.history(roomId, req.query as unknown as HistoryQuery));
  });

  router.post(
    '/chat/rooms/:roomId/messages',
    requireUser,
    validate({ params: roomParamsSchema }),
    // The room is checked before any photo is received.
    async (req, res, next) => {
      res.locals.roomAccess = await authorizeRoom(currentUser(req).id, (req.params as unknown as RoomParams).roomId);
      next();
    },
    photosIfAny,
    validate({ body: postMessageSchema }),
    async (req, res) => {
      const access = res.locals.roomAccess as RoomAccess;
      res.status(201).json(await chat.postMessage(deps, access, currentUser(req), { body: req.body.body, files: receivedFiles(req) }));
    },
  );

  router.patch('/chat/messages/:messageId', requireUser, validate({ params: messageParamsSchema, body: editMessageSchema }), async (req, res) => {
    const { messageId } = req.params as unknown as MessageParams;
    res.json(await chat.editMessage(deps, currentUser(req).id, messageId, req.body.body));
  });

  router.delete('/chat/messages/:messageId', requireUser, validate({ params: messageParamsSchema }), async (req, res) => {
    const { messageId } = req.params as unknown as MessageParams;
    res.json(await chat.deleteMessage(deps, currentUser(req).id, messageId));
  });

  router.get('/swaps/:swapId/chat', requireUser, validate({ params: swapParamsSchema }), async (req, res) => {
    const { swapId } = req.params as unknown as z.infer<typeof swapParamsSchema>;
    res.json(await swapRoom(currentUser(req).id, swapId));
  });

  return router;
}
