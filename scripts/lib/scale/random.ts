// A small seeded generator (mulberry32) so the scale data is the same on every run with the same seed.

export class Rng {
  private state: number;

  constructor(seed: number) {
    this.state = seed >>> 0;
  }

  /** Uniform in [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** Whole number in [min, max], both ends included. */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  between(min: number, max: number): number {
    return min + this.next() * (max - min);
  }

  chance(p: number): boolean {
    return this.next() < p;
  }

  pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.next() * items.length)];
  }

  /** Picks by weight: `[[value, weight], …]`. */
  weighted<T>(choices: readonly (readonly [T, number])[]): T {
    const total = choices.reduce((sum, [, w]) => sum + w, 0);
    let roll = this.next() * total;
    for (const [value, w] of choices) {
      roll -= w;
      if (roll < 0) return value;
    }
    return choices[choices.length - 1][0];
  }

  /** `k` distinct items, in random order (partial Fisher–Yates on a copy). */
  sample<T>(items: readonly T[], k: number): T[] {
    const copy = items.slice();
    const n = Math.min(k, copy.length);
    for (let i = 0; i < n; i++) {
      const j = i + Math.floor(this.next() * (copy.length - i));
      [copy[i], copy[j]] = [copy[j], copy[i]];
    }
    return copy.slice(0, n);
  }

  /** Non-empty random subset, keeping the original order. */
  subset<T>(items: readonly T[], min = 1): T[] {
    const chosen = items.filter(() => this.chance(0.5));
    return chosen.length >= min ? chosen : this.sample(items, min);
  }

  /** A version-4 shaped uuid drawn from this generator, so ids repeat run to run. */
  uuid(): string {
    const hex = (n: number) => Math.floor(this.next() * 16 ** n).toString(16).padStart(n, '0');
    const variant = (8 + this.int(0, 3)).toString(16);
    return `${hex(8)}-${hex(4)}-4${hex(3)}-${variant}${hex(3)}-${hex(6)}${hex(6)}`;
  }
}
