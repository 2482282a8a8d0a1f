/** Strings numbered in the order first seen: a lookup table and the index of each value in it. */
export class Interner {
  readonly values: string[] = [];
  private readonly index = new Map<string, number>();

  of(value: string): number {
    let i = this.index.get(value);
    if (i === undefined) {
      i = this.values.length;
      this.values.push(value);
      this.index.set(value, i);
    }
    return i;
  }
}
