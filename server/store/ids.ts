// Record ids: UUID version 7 (RFC 9562, §5.7), so ids sort by creation time and new rows go
// to the right-hand end of each primary-key index instead of a random page of it (a random
// version-4 id makes every insert into a large table touch a page that is rarely cached).
import { randomFillSync } from "node:crypto";

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, "0"));
const pool = new Uint8Array(9 * 512);
let poolAt = pool.length;
let lastMs = -1;
let seq = 0;

/**
 * A version-7 UUID: 48 bits of Unix time in milliseconds, the version, a 12-bit counter
 * (RFC 9562 §6.2, method 1: it restarts at a random value each millisecond and, should it
 * run out within one, borrows the next millisecond, so ids from one process never go
 * backwards), the variant, and 62 random bits.
 */
export function timeOrderedId(nowMs = Date.now()): string {
  if (poolAt + 9 > pool.length) {
    randomFillSync(pool);
    poolAt = 0;
  }
  let ms = nowMs > lastMs ? nowMs : lastMs;
  if (ms === lastMs) {
    seq++;
    if (seq > 0xfff) {
      ms++;
      seq = pool[poolAt + 8]! & 0x7f;
    }
  } else seq = pool[poolAt + 8]! & 0x7f; // a random start leaves room for 3,968 more ids in the millisecond
  lastMs = ms;
  const r = pool.subarray(poolAt, poolAt + 8);
  poolAt += 9;
  const t = ms.toString(16).padStart(12, "0");
  const a = (0x7000 | seq).toString(16);
  return `${t.slice(0, 8)}-${t.slice(8)}-${a}-${HEX[0x80 | (r[0]! & 0x3f)]}${HEX[r[1]!]}-${HEX[r[2]!]}${HEX[r[3]!]}${HEX[r[4]!]}${HEX[r[5]!]}${HEX[r[6]!]}${HEX[r[7]!]}`;
}
