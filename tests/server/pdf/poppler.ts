/** Small wrappers around poppler-utils (Debian package poppler-utils) for the certificate tests. */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export function tempDir(prefix = 'emberline-pdf-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

export function writeTemp(dir: string, name: string, bytes: Uint8Array): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

/** Text of each page (pdftotext separates pages by form feeds); no-break and thin spaces read as spaces. */
export function pageTexts(pdfPath: string): string[] {
  const out = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', pdfPath, '-'], { encoding: 'utf8' });
  const pages = out.split('\f').map((p) => p.replace(/[\u00A0\u2009\u202F]/g, ' '));
  return pages.at(-1)?.trim() === '' ? pages.slice(0, -1) : pages;
}

export interface FontRow { name: string; type: string; embedded: boolean }

/** pdffonts rows: name, type, and whether the font program is embedded. */
export function fonts(pdfPath: string): FontRow[] {
  const out = execFileSync('pdffonts', [pdfPath], { encoding: 'utf8' });
  return out
    .split('\n')
    .slice(2)
    .filter((l) => l.trim())
    .map((line) => {
      // name type… encoding emb sub uni id gen: read the three yes/no columns from the right.
      const cols = line.trim().split(/\s+/);
      const [emb] = cols.slice(-5, -4);
      return { name: cols[0], type: cols.slice(1, -6).join(' '), embedded: emb === 'yes' };
    });
}

/** pdfsig's report (it exits non-zero for an invalid signature, so read stdout either way). */
export function pdfsig(pdfPath: string): string {
  const r = spawnSync('pdfsig', [pdfPath], { encoding: 'utf8' });
  return `${r.stdout}${r.stderr}`;
}

export function pageCount(pdfPath: string): number {
  const out = execFileSync('pdfinfo', [pdfPath], { encoding: 'utf8' });
  return Number(/Pages:\s+(\d+)/.exec(out)?.[1] ?? 0);
}
