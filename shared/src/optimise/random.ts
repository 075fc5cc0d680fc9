/*
 * Seeded random numbers for the Yield forecast. The generator is mulberry32 (T. Ettinger, 2017): a
 * 32-bit Weyl sequence a_k = seed + k·0x6D2B79F5 (mod 2³²) passed through an integer mixing
 * function. Because its state is that counter, the stream can start at any position k at once,
 * so trial i of a forecast always draws the same numbers however the trials are split across
 * threads. Normal deviates come from the Box–Muller transform (G. E. P. Box, M. E. Muller, Ann.
 * Math. Stat. 29, 610 (1958)).
 */

const WEYL = 0x6d2b79f5;
const TWO_32 = 4294967296;

/** A mulberry32 stream that can jump to any position. Allocation-free after construction. */
export class Mulberry32 {
  private state = 0;

  constructor(private readonly seed: number) {
    this.seek(0);
  }

  /** Positions the stream so that the next draw is draw number `position` (0-based) of the seed. */
  seek(position: number): void {
    this.state = (this.seed + Math.imul(position >>> 0, WEYL)) >>> 0;
  }

  /** The next 32-bit unsigned integer. */
  nextUint32(): number {
    this.state = (this.state + WEYL) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (t ^ (t >>> 14)) >>> 0;
  }

  /** Uniform in (0, 1): the 32-bit draw offset by half a step, so 0 and 1 never occur. */
  nextOpenUnit(): number {
    return (this.nextUint32() + 0.5) / TWO_32;
  }
}

/**
 * Fills `out[0…count)` with standard normal deviates (Box–Muller, both the cosine and the sine
 * deviate of each pair) or with uniform deviates on (−1, 1), drawing 2·⌈count/2⌉ numbers either
 * way so the count of draws does not depend on the distribution. Returns out.
 */
export function fillDeviates(
  out: Float64Array,
  count: number,
  random: Mulberry32,
  distribution: 'normal' | 'uniform',
): Float64Array {
  for (let i = 0; i < count; i += 2) {
    const u1 = random.nextOpenUnit();
    const u2 = random.nextOpenUnit();
    if (distribution === 'normal') {
      const radius = Math.sqrt(-2 * Math.log(u1));
      const angle = 2 * Math.PI * u2;
      out[i] = radius * Math.cos(angle);
      if (i + 1 < count) out[i + 1] = radius * Math.sin(angle);
    } else {
      out[i] = 2 * u1 - 1;
      if (i + 1 < count) out[i + 1] = 2 * u2 - 1;
    }
  }
  return out;
}

/** Draws per trial for `count` deviates (pairs, see {@link fillDeviates}). */
export function drawsFor(count: number): number {
  return 2 * Math.ceil(count / 2);
}
