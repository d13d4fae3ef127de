import type { ClosedLoop } from "../policy/closed-loop.js";

/**
 * The burn-in of many one-number loops, 3 at a time in interleaved lanes so that their
 * independent exp() evaluations overlap in the processor. The three lane bodies are one body
 * written out three times on purpose (the unrolling is what lets the lanes overlap; a loop
 * over lane arrays measured slower): change all three together. Per cell it is exactly
 * longRun's burn-in: Brent's cycle check (periods up to maxPeriod) plus an immediate check for
 * fixed points and 2-cycles; results go to n, period, done (steps taken) and bad (unbounded).
 */
export function burnInLanes(
  loops: readonly ClosedLoop[],
  cells: readonly number[],
  x0: number,
  burnIn: number,
  bounds: Float64Array,
  n: Float64Array,
  period: Int32Array,
  done: Int32Array,
  bad: Uint8Array,
  maxPeriod: number,
): void {
  const k = cells.length;
  let next = 0;
  let n0 = 0,
    t0 = 0,
    p0 = 1,
    m0 = 0,
    c0 = -1,
    q0 = 0,
    r0 = 0;
  let n1 = 0,
    t1 = 0,
    p1 = 1,
    m1 = 0,
    c1 = -1,
    q1 = 0,
    r1 = 0;
  let n2 = 0,
    t2 = 0,
    p2 = 1,
    m2 = 0,
    c2 = -1,
    q2 = 0,
    r2 = 0;
  let s0 = 0;
  let lp0: ClosedLoop = loops[0]!;
  let b0 = 0;
  let s1 = 0;
  let lp1: ClosedLoop = loops[0]!;
  let b1 = 0;
  let s2 = 0;
  let lp2: ClosedLoop = loops[0]!;
  let b2 = 0;
  if (burnIn === 0) {
    for (let i = 0; i < k; i++) {
      n[i] = x0;
      done[i] = 0;
    }
    return;
  }
  for (;;) {
    if (c0 < 0 && next < k) {
      c0 = next++;
      n0 = x0;
      t0 = x0;
      q0 = NaN;
      r0 = NaN;
      p0 = 1;
      m0 = 0;
      s0 = 0;
      lp0 = loops[cells[c0]!]!;
      b0 = bounds[c0]!;
    }
    if (c1 < 0 && next < k) {
      c1 = next++;
      n1 = x0;
      t1 = x0;
      q1 = NaN;
      r1 = NaN;
      p1 = 1;
      m1 = 0;
      s1 = 0;
      lp1 = loops[cells[c1]!]!;
      b1 = bounds[c1]!;
    }
    if (c2 < 0 && next < k) {
      c2 = next++;
      n2 = x0;
      t2 = x0;
      q2 = NaN;
      r2 = NaN;
      p2 = 1;
      m2 = 0;
      s2 = 0;
      lp2 = loops[cells[c2]!]!;
      b2 = bounds[c2]!;
    }
    if (c0 < 0 && c1 < 0 && c2 < 0) return;
    if (c0 >= 0) {
      if (m0 === p0) {
        t0 = n0;
        p0 *= 2;
        m0 = 0;
      }
      r0 = q0;
      q0 = n0;
      n0 = lp0.next(n0);
      m0++;
      s0++;
      if (!(n0 <= b0)) {
        bad[c0] = 1;
        c0 = -1;
      } else if (n0 === q0 || n0 === r0) {
        // A fixed point or a 2-cycle, caught the step it closes (Brent's check alone can
        // take up to twice as long to notice it).
        period[c0] = n0 === q0 ? 1 : 2;
        done[c0] = s0;
        n[c0] = n0;
        c0 = -1;
      } else if (n0 === t0 && m0 <= maxPeriod) {
        period[c0] = m0;
        done[c0] = s0;
        n[c0] = n0;
        c0 = -1;
      } else if (s0 === burnIn) {
        done[c0] = burnIn;
        n[c0] = n0;
        c0 = -1;
      }
    }
    if (c1 >= 0) {
      if (m1 === p1) {
        t1 = n1;
        p1 *= 2;
        m1 = 0;
      }
      r1 = q1;
      q1 = n1;
      n1 = lp1.next(n1);
      m1++;
      s1++;
      if (!(n1 <= b1)) {
        bad[c1] = 1;
        c1 = -1;
      } else if (n1 === q1 || n1 === r1) {
        // A fixed point or a 2-cycle, caught the step it closes (Brent's check alone can
        // take up to twice as long to notice it).
        period[c1] = n1 === q1 ? 1 : 2;
        done[c1] = s1;
        n[c1] = n1;
        c1 = -1;
      } else if (n1 === t1 && m1 <= maxPeriod) {
        period[c1] = m1;
        done[c1] = s1;
        n[c1] = n1;
        c1 = -1;
      } else if (s1 === burnIn) {
        done[c1] = burnIn;
        n[c1] = n1;
        c1 = -1;
      }
    }
    if (c2 >= 0) {
      if (m2 === p2) {
        t2 = n2;
        p2 *= 2;
        m2 = 0;
      }
      r2 = q2;
      q2 = n2;
      n2 = lp2.next(n2);
      m2++;
      s2++;
      if (!(n2 <= b2)) {
        bad[c2] = 1;
        c2 = -1;
      } else if (n2 === q2 || n2 === r2) {
        // A fixed point or a 2-cycle, caught the step it closes (Brent's check alone can
        // take up to twice as long to notice it).
        period[c2] = n2 === q2 ? 1 : 2;
        done[c2] = s2;
        n[c2] = n2;
        c2 = -1;
      } else if (n2 === t2 && m2 <= maxPeriod) {
        period[c2] = m2;
        done[c2] = s2;
        n[c2] = n2;
        c2 = -1;
      } else if (s2 === burnIn) {
        done[c2] = burnIn;
        n[c2] = n2;
        c2 = -1;
      }
    }
  }
}
