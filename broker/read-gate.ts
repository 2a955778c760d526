// Backpressure across every connection. A gateway's messages wait in the publish hook until they are
// committed, and aedes reads a connection's next packets only when its current ones are settled; but
// with thousands of connections each one's unsettled packets add up, and under overload the service's
// memory would grow with the whole fleet's backlog. So, while too many publishes are unsettled, the
// broker reads from no connection at all: the kernel's buffers fill and TCP slows the gateways down.
// Reading starts again when the count has fallen to half.
import type { Socket } from 'node:net';

/** Connections woken per turn of the event loop when reading starts again. */
const WAKE_SLICE = 200;

export class ReadGate {
  private outstanding = 0;
  private closed = false;
  private held = new Set<Socket>();
  private waking = false;
  /** `onClose` counts the pauses (for the metrics). */
  constructor(private readonly high: number, private readonly onClose: () => void = () => {}, private readonly low = Math.floor(high / 2)) {
    if (!(high > 0) || low >= high) throw new RangeError(`read gate needs 0 <= low < high, got ${low}, ${high}`);
  }

  /** Routes the socket's reads through the gate. aedes and Node's stream machinery both read via socket.read(). */
  attach(socket: Socket) {
    const read = socket.read;
    const gate = this;
    socket.read = function gatedRead(this: Socket, n?: number) {
      if (gate.closed) {
        gate.held.add(this);
        return null;
      }
      return read.call(this, n);
    } as Socket['read'];
    socket.once('close', () => this.held.delete(socket));
  }

  get isClosed() {
    return this.closed;
  }

  get unsettled() {
    return this.outstanding;
  }

  /** A publish entered the hook. */
  enter() {
    if (++this.outstanding >= this.high && !this.closed) {
      this.closed = true;
      this.onClose();
    }
  }

  /** A publish was settled (committed, quarantined or refused). */
  leave() {
    this.outstanding--;
    if (!this.closed || this.outstanding > this.low) return;
    this.closed = false;
    this.wake();
  }

  /**
   * Tells the held readers that their data is there (aedes reads on 'readable'), a slice at a time: all
   * of them at once would parse thousands of connections' packets in one turn of the event loop and keep
   * the database's answers (the commits everyone waits for) waiting behind them.
   */
  private wake() {
    let n = 0;
    for (const s of this.held) {
      if (this.closed || n++ >= WAKE_SLICE) break;
      this.held.delete(s);
      if (!s.destroyed) s.emit('readable');
    }
    if (this.held.size && !this.closed && !this.waking) {
      this.waking = true;
      setImmediate(() => {
        this.waking = false;
        if (!this.closed) this.wake();
      });
    }
  }
}
