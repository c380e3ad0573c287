/**
 * An answer a compute endpoint has already serialised (on a worker thread): the route sends
 * these bytes as they are, which are exactly `JSON.stringify` of the engine's result.
 */
export class SerializedAnswer {
  constructor(readonly bytes: Buffer) {}
}
