// Work gathered over one turn of the event loop and handed on as one batch: the group
// commit writes a turn's rows in one transaction, and the quick analyses send a turn's tasks
// to their thread in one message. A message or a commit costs about as much as a small task,
// so one per turn instead of one per request is what lets a burst of requests be answered
// quickly (the load benchmark measures it).

/** Collects items until the event loop's current turn ends, then calls `flush` with all of them. */
export class TurnBatch<T> {
  private queue: T[] = [];
  private scheduled = false;

  constructor(private readonly flush: (batch: T[]) => void) {}

  add(item: T): void {
    this.queue.push(item);
    if (this.scheduled) return;
    this.scheduled = true;
    setImmediate(() => {
      this.scheduled = false;
      const batch = this.queue;
      this.queue = [];
      this.flush(batch);
    });
  }
}
