/**
 * The order of live re-plans while something is dragged. Every position of the drag gets a
 * number; at most one re-plan is with the lead worker at a time, and a newer position replaces a
 * waiting older one (never a queue: the worker plans the newest position it can reach, so the
 * rate follows what the worker can hold). An answer is shown only if it is newer than the one
 * shown and belongs to the drag in progress: a result for an older position never replaces a
 * newer one.
 */
export interface LiveAsk<T> {
  seq: number;
  what: T;
}

export class LiveQueue<T> {
  /** The newest position asked for (numbers never restart, so a late answer of an earlier drag is known). */
  #seq = 0;
  /** Numbers up to this one belong to earlier drags. */
  #dragFrom = 0;
  #shown = 0;
  #active = false;
  #inFlight: LiveAsk<T> | null = null;
  #next: LiveAsk<T> | null = null;
  readonly #send: (ask: LiveAsk<T>) => void;

  constructor(send: (ask: LiveAsk<T>) => void) {
    this.#send = send;
  }

  get active(): boolean {
    return this.#active;
  }

  /** True while a re-plan is with the worker. */
  get busy(): boolean {
    return this.#inFlight !== null;
  }

  /** True when the drag has moved on since the shown answer (the view is following). */
  get following(): boolean {
    return this.#active && this.#shown < this.#seq;
  }

  /** A new position of the drag (the first one starts it). */
  move(what: T): void {
    if (!this.#active) {
      this.#active = true;
      this.#dragFrom = this.#seq;
      this.#shown = this.#seq;
    }
    const ask = { seq: ++this.#seq, what };
    if (this.#inFlight) this.#next = ask;
    else this.#post(ask);
  }

  #post(ask: LiveAsk<T>): void {
    this.#inFlight = ask;
    this.#send(ask);
  }

  /**
   * The worker answered position `seq` (a result or an error). Returns what was asked when the
   * answer is to be shown, or null (an older or a finished drag's answer). Sends the waiting
   * position, if any.
   */
  answer(seq: number): T | null {
    let asked: T | null = null;
    if (this.#inFlight?.seq === seq) {
      asked = this.#inFlight.what;
      this.#inFlight = null;
      const next = this.#next;
      this.#next = null;
      if (next && this.#active) this.#post(next);
    }
    if (!this.#active || asked === null || seq <= this.#shown || seq <= this.#dragFrom) return null;
    this.#shown = seq;
    return asked;
  }

  /** The drag ended (or was abandoned): a waiting position is dropped, later answers are not shown. */
  end(): void {
    this.#active = false;
    this.#next = null;
  }

  /** The workers were stopped: nothing is in flight any more. */
  reset(): void {
    this.end();
    this.#inFlight = null;
  }
}
