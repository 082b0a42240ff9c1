/** Where the server reads the time, so tests can move it (token expiry, audit times). */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };

/** A clock for tests that stands still until moved. */
export function createFakeClock(start: Date | string = '2025-03-03T08:00:00.000Z') {
  let current = new Date(start).getTime();
  return {
    now: () => new Date(current),
    advance(milliseconds: number) {
      current += milliseconds;
    },
    set(moment: Date | string) {
      current = new Date(moment).getTime();
    },
  };
}
export type FakeClock = ReturnType<typeof createFakeClock>;
