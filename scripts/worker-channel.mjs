// The web server's side of lib/services/off-loop.ts: requests sent to the worker process over its IPC channel and
// the replies matched back by id. A request still waiting when that worker exits gets an error reply: the worker's
// write transaction never committed, so nothing of it was stored.
export const OFF_LOOP_CHANNEL = Symbol.for('lattice-ledger.off-loop');

export function createWorkerChannel() {
  let current = null;
  let ready = false;
  let nextId = 0;
  const pending = new Map();
  return {
    /** Sends the next requests to `proc` (a child with an IPC channel), once it says it is ready. */
    attach(proc) {
      current = proc;
      ready = false;
      proc.on('message', (message) => {
        if (message && message.type === 'ready' && current === proc) ready = true;
        const waiting = message && pending.get(message.id);
        if (waiting && waiting.proc === proc) {
          pending.delete(message.id);
          waiting.resolve(message);
        }
      });
      proc.on('exit', () => {
        if (current === proc) ready = false;
        for (const [id, waiting] of pending) {
          if (waiting.proc !== proc) continue;
          pending.delete(id);
          waiting.resolve({ ok: false, error: { message: 'The worker process stopped while it handled this request; nothing of it was stored. Send it again.' } });
        }
      });
    },
    available: () => ready && current?.connected === true,
    request: (op, payload) =>
      new Promise((resolve) => {
        const id = ++nextId;
        pending.set(id, { proc: current, resolve });
        current.send({ id, op, payload });
      }),
  };
}
