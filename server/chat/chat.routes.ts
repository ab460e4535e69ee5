import { Router, type Request, type RequestHandler } from 'express';
import {
  editMessageSchema,
  historyQuerySchema,
  messageParamsSchema,
  postMessageSchema,
  roomParamsSchema,
} from '@shared/schemas/chat';
import { swapParamsSchema } from '@shared/schemas/live';
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { photoUploadMiddleware, receivedFiles } from '../uploads/photo-pipeline';
import type { AppDeps } from '../deps';
import { authorizeRoom } from './chat.policy';
import { roomDto, swapRoom } from './chat-rooms.service';
import * as chat from './chat.service';

/** Chat: rooms, history and messages over REST; the live part broadcasts every change to the room. */
export function chatRouter(deps: AppDeps) {
  const router = Router();
  const inRoom = (req: Request, { params }: { params: { roomId: number } }) =>
    authorizeRoom(deps, currentUser(req).id, params.roomId);
  const upload = photoUploadMiddleware();
  // A message with photos comes as multipart/form-data (field `photos`, caption in `body`); text alone as JSON.
  const photosIfAny: RequestHandler = (req, res, next) => (req.is('multipart/form-data') ? upload(req, res, next) : next());

  router.get(
    '/chat/rooms/:roomId',
    requireUser,
    route({ params: roomParamsSchema, authorize: inRoom }, async ({ access }, req, res) => {
      res.json(roomDto(access, currentUser(req).id));
    }),
  );

  router.get(
    '/chat/rooms/:roomId/messages',
    requireUser,
    route({ params: roomParamsSchema, query: historyQuerySchema, authorize: inRoom }, async ({ params, query }, _req, res) => {
      res.json(await chat.history(deps, params.roomId, query));
    }),
  );

  // The room is checked before any photo is received.
  router.post(
    '/chat/rooms/:roomId/messages',
    requireUser,
    route(
      { params: roomParamsSchema, authorize: inRoom, receive: photosIfAny, body: postMessageSchema },
      async ({ body, access }, req, res) => {
        res
          .status(201)
          .json(await chat.postMessage(deps, access, currentUser(req), { body: body.body, files: receivedFiles(req) }));
      },
    ),
  );

  router.patch(
    '/chat/messages/:messageId',
    requireUser,
    route({ params: messageParamsSchema, body: editMessageSchema }, async ({ params, body }, req, res) => {
      res.json(await chat.editMessage(deps, currentUser(req).id, params.messageId, body.body));
    }),
  );

  router.delete(
    '/chat/messages/:messageId',
    requireUser,
    route({ params: messageParamsSchema }, async ({ params }, req, res) => {
      res.json(await chat.deleteMessage(deps, currentUser(req).id, params.messageId));
    }),
  );

  router.get(
    '/swaps/:swapId/chat',
    requireUser,
    route({ params: swapParamsSchema }, async ({ params }, req, res) => {
      res.json(await swapRoom(deps, currentUser(req).id, params.swapId));
    }),
  );

  return router;
}
