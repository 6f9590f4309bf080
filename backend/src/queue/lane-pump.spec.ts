import { LanePump } from './lane-pump';

/** A pass that waits until the test lets it end. */
function gatedPasses(): { drain: () => Promise<void>; passes: () => number; open: () => void } {
  let count = 0;
  let release: (() => void) | null = null;
  return {
    drain: () => {
      count += 1;
      return new Promise<void>((resolve) => {
        release = resolve;
      });
    },
    passes: () => count,
    open: () => {
      const next = release;
      release = null;
      next?.();
    },
  };
}

/** Errors the first two tests must not see. */
const unexpected: unknown[] = [];
const collect = (error: unknown): void => {
  unexpected.push(error);
};

const tick = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

describe('LanePump', () => {
  afterEach(() => {
    expect(unexpected).toEqual([]);
  });

  it('runs one pass at a time; calls during a pass add exactly one more pass', async () => {
    const gate = gatedPasses();
    const pump = new LanePump({ drain: gate.drain, stopping: () => false, onError: collect });
    for (let call = 0; call < 4; call++) pump.run();
    // Passes counted after each pass is let go: the first, the one more it owes, then none.
    const counted: number[] = [];
    for (let pass = 0; pass < 3; pass++) {
      await tick();
      counted.push(gate.passes());
      gate.open();
    }
    await pump.settled();
    expect(counted).toEqual([1, 2, 2]);
    // Idle again: the next call starts a new pass at once.
    pump.run();
    await tick();
    expect(gate.passes()).toBe(3);
    gate.open();
    await pump.settled();
  });

  it('starts and repeats nothing once its owner stops; settled() waits for the pass under way', async () => {
    const gate = gatedPasses();
    let stopping = false;
    const pump = new LanePump({ drain: gate.drain, stopping: () => stopping, onError: collect });
    pump.run();
    pump.run();
    stopping = true;
    let settled = false;
    const waiting = pump.settled().then(() => {
      settled = true;
    });
    await tick();
    expect(settled).toBe(false);
    gate.open();
    await waiting;
    expect(gate.passes()).toBe(1);
    pump.run();
    await tick();
    expect(gate.passes()).toBe(1);
  });

  it('a pass that throws is reported and the pump runs again afterwards', async () => {
    const errors: unknown[] = [];
    let passes = 0;
    const pump = new LanePump({
      drain: () => {
        passes += 1;
        return passes === 1 ? Promise.reject(new Error('disk full')) : Promise.resolve();
      },
      stopping: () => false,
      onError: (error) => errors.push(error),
    });
    pump.run();
    await pump.settled();
    expect(errors).toEqual([new Error('disk full')]);
    pump.run();
    await pump.settled();
    expect(passes).toBe(2);
  });
});
