import { EventEmitter } from 'node:events';

/**
 * In-process domain events, emitted by services after their transaction commits. The live board and
 * the mail jobs subscribe here, so the services that change data know nothing about either.
 */
export interface DomainEventMap {
  'member.joined': { guildId: number; userId: number; role: string };
  'member.removed': { guildId: number; userId: number };
}

export class DomainEvents {
  private emitter = new EventEmitter();

  constructor() {
    this.emitter.setMaxListeners(50);
  }

  emit<K extends keyof DomainEventMap>(name: K, payload: DomainEventMap[K]) {
    this.emitter.emit(name, payload);
  }

  on<K extends keyof DomainEventMap>(name: K, listener: (payload: DomainEventMap[K]) => void | Promise<void>) {
    this.emitter.on(name, (payload: DomainEventMap[K]) => {
      // A listener's failure must never undo or fail the request that emitted the event.
      Promise.resolve()
        .then(() => listener(payload))
        .catch((error: unknown) => this.emitter.emit('listener-error', { name, error }));
    });
  }

  onListenerError(handler: (info: { name: string; error: unknown }) => void) {
    this.emitter.on('listener-error', handler);
  }
}
