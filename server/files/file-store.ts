import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export type StoredFile = { sha256: string; size: number };

/**
 * Content-addressed file storage under `<dataDir>/files/<sha256>`. A file is written to a
 * temporary name, flushed and renamed into place, so a reader never sees half a file and the
 * same bytes are stored once. Files are never overwritten or deleted here: a record that
 * points at a hash keeps pointing at the same bytes (ISO/IEC 17025:2017 §7.5, §8.4).
 */
export function createFileStore(dataDir: string) {
  const dir = path.join(dataDir, 'files');
  const pathOf = (sha256: string) => {
    if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('Not a SHA-256 hex digest.');
    return path.join(dir, sha256);
  };
  return {
    pathOf,
    /** Stores the bytes (if not stored yet) and returns their SHA-256 and size. */
    put(bytes: Buffer): StoredFile {
      const sha256 = crypto.createHash('sha256').update(bytes).digest('hex');
      const target = pathOf(sha256);
      if (!fs.existsSync(target)) {
        fs.mkdirSync(dir, { recursive: true });
        const tmp = path.join(dir, `.${sha256}.${crypto.randomBytes(6).toString('hex')}.tmp`);
        const fd = fs.openSync(tmp, 'wx', 0o600);
        try {
          fs.writeSync(fd, bytes);
          fs.fsyncSync(fd);
        } finally {
          fs.closeSync(fd);
        }
        fs.renameSync(tmp, target);
      }
      return { sha256, size: bytes.length };
    },
    exists(sha256: string): boolean {
      return fs.existsSync(pathOf(sha256));
    },
    read(sha256: string): Buffer {
      return fs.readFileSync(pathOf(sha256));
    },
    /** Reads the file and checks its bytes still hash to the name; null when missing or changed. */
    readVerified(sha256: string): Buffer | null {
      const p = pathOf(sha256);
      if (!fs.existsSync(p)) return null;
      const bytes = fs.readFileSync(p);
      return crypto.createHash('sha256').update(bytes).digest('hex') === sha256 ? bytes : null;
    },
    /** Names of the stored files (for tests and maintenance). */
    list(): string[] {
      return fs.existsSync(dir) ? fs.readdirSync(dir).filter((n) => /^[0-9a-f]{64}$/.test(n)) : [];
    },
  };
}
export type FileStore = ReturnType<typeof createFileStore>;
