import 'server-only';
import { mkdtemp, open, rm, type FileHandle } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { deserialize, serialize } from 'node:v8';

/**
 * Chunks of validated rows waiting for the write transaction, in a temporary
 * file (v8 serialisation, exact for the plain values rows hold), so that the
 * whole file can be validated before the lock is taken without holding a
 * two-million-row file in memory.
 */
export class StagedChunks<T> {
  private readonly sizes: number[] = [];
  private written = 0;

  private constructor(
    private readonly dir: string,
    private readonly file: FileHandle,
  ) {}

  static async open<T>(): Promise<StagedChunks<T>> {
    const dir = await mkdtemp(join(tmpdir(), 'ledger-staged-'));
    try {
      return new StagedChunks<T>(dir, await open(join(dir, 'chunks.bin'), 'w+'));
    } catch (e) {
      await rm(dir, { recursive: true, force: true });
      throw e;
    }
  }

  get count(): number {
    return this.sizes.length;
  }

  async push(chunk: T): Promise<void> {
    const bytes = serialize(chunk);
    await this.file.write(bytes, 0, bytes.length, this.written);
    this.written += bytes.length;
    this.sizes.push(bytes.length);
  }

  async *chunks(): AsyncGenerator<T> {
    let at = 0;
    for (const size of this.sizes) {
      const bytes = Buffer.alloc(size);
      await this.file.read(bytes, 0, size, at);
      at += size;
      yield deserialize(bytes) as T;
    }
  }

  async dispose(): Promise<void> {
    await this.file.close().catch(() => undefined);
    await rm(this.dir, { recursive: true, force: true });
  }
}
