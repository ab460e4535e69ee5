/**
 * The socket.io contract between the client and the server: event names are `resource:verb`, every
 * client event may take an acknowledgement callback answered with `{ data }` or `{ error }`.
 */
import type { ChatMessageDto } from './schemas/chat';
import type { BoardRef, ChatRoomRef } from './schemas/live';
import type { RosterDto, RosterRowDto } from './swap-types';
import type { SendMessageInput } from './schemas/chat';

export interface LiveError {
  code: string;
  message: string;
  fields?: Record<string, string>;
}

export type Ack<T> = { data: T } | { error: LiveError };
export type AckCallback<T> = (answer: Ack<T>) => void;

export interface Viewer {
  userId: number;
  displayName: string;
}

export type RoomRef = { kind: 'board'; swapId: number } | { kind: 'chat'; roomId: number };

export interface PresenceChange {
  room: RoomRef;
  viewers: Viewer[];
}

/** What happened on a swap, for the recent-activity list. */
export interface ActivityDto {
  id: number;
  swapId: number;
  kind: string;
  actor: Viewer | null;
  /** The person the change is about (the maker of a block, the member who signed up). */
  subject: Viewer | null;
  blockId: number | null;
  detail: Record<string, string | number | boolean | null>;
  at: string;
}

/** The rows and totals that changed, recomputed from the database after the commit. */
export interface BoardPatch {
  swap: RosterDto['swap'];
  totals: RosterDto['totals'];
  rows: RosterRowDto[];
  /** People who no longer have a row (a withdrawn sign-up). */
  removedUserIds: number[];
  /** True when `rows` is every row of the roster (after a redistribution). */
  complete: boolean;
}

export interface BoardChange {
  swapId: number;
  /** Increases by one with every change of this swap, on every node alike. */
  version: number;
  /** What happened, newest first (several when changes came in a burst). */
  activities: ActivityDto[];
  /** Null when the change cannot be patched in; the client refetches the roster then. */
  patch: BoardPatch | null;
}

export interface BoardJoined {
  version: number;
  viewers: Viewer[];
}

export interface ChatJoined {
  viewers: Viewer[];
}

export interface Typing {
  roomId: number;
  user: Viewer;
}

export interface ServerToClientEvents {
  'board:changed': (change: BoardChange) => void;
  'presence:changed': (change: PresenceChange) => void;
  'message:created': (message: ChatMessageDto) => void;
  'message:updated': (message: ChatMessageDto) => void;
  'typing:started': (typing: Typing) => void;
  /** The user left (or was removed from) a guild; its rooms are closed to this socket. */
  'guild:left': (info: { guildId: number }) => void;
}

export interface ClientToServerEvents {
  'board:join': (ref: BoardRef, ack?: AckCallback<BoardJoined>) => void;
  'board:leave': (ref: BoardRef, ack?: AckCallback<true>) => void;
  'chat:join': (ref: ChatRoomRef, ack?: AckCallback<ChatJoined>) => void;
  'chat:leave': (ref: ChatRoomRef, ack?: AckCallback<true>) => void;
  'message:send': (input: SendMessageInput, ack?: AckCallback<ChatMessageDto>) => void;
  'typing:start': (ref: ChatRoomRef) => void;
}

/** What the server keeps on each socket (`socket.data`), visible to every node through fetchSockets. */
export interface SocketData {
  user: Viewer;
}
