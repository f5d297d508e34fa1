/**
 * The sync agent's journal: what it has already sent (path, size, SHA-256), so a restart never
 * sends a file twice. A small JSON file kept OUTSIDE the watched folder (the agent never writes
 * into the dyno's folder), replaced atomically (write a temporary file, then rename).
 */
import fs from 'node:fs';
import path from 'node:path';

export interface JournalEntry {
  size: number;
  sha256: string;
  sentAt: string;
  /** One line about the outcome, for `--status` and for people reading the file. */
  outcome: string;
}

interface JournalFile {
  version: 1;
  server: string;
  folder: string;
  sent: Record<string, JournalEntry>;
}

export class Journal {
  private data: JournalFile;
  private readonly hashes = new Set<string>();

  private constructor(
    readonly file: string,
    data: JournalFile,
  ) {
    this.data = data;
    for (const e of Object.values(data.sent)) this.hashes.add(e.sha256);
  }

  /** Opens (or starts) the journal; a damaged file is kept aside and a new one started, never silently trusted. */
  static open(file: string, server: string, folder: string): Journal {
    const empty: JournalFile = { version: 1, server, folder, sent: {} };
    if (!fs.existsSync(file)) return new Journal(file, empty);
    try {
      const parsed = JSON.parse(fs.readFileSync(file, 'utf8')) as JournalFile;
      if (parsed?.version !== 1 || typeof parsed.sent !== 'object' || parsed.sent === null) throw new Error('not a journal');
      return new Journal(file, parsed);
    } catch {
      const aside = `${file}.damaged-${Date.now()}`;
      fs.renameSync(file, aside);
      return new Journal(file, empty);
    }
  }

  /** Was this exact content sent before, from this path or any other? */
  wasSent(relPath: string, sha256: string): boolean {
    return this.data.sent[relPath]?.sha256 === sha256 || this.hashes.has(sha256);
  }

  entry(relPath: string): JournalEntry | undefined {
    return this.data.sent[relPath];
  }

  get size(): number {
    return Object.keys(this.data.sent).length;
  }

  record(relPath: string, entry: JournalEntry) {
    this.data.sent[relPath] = entry;
    this.hashes.add(entry.sha256);
    this.save();
  }

  private save() {
    fs.mkdirSync(path.dirname(this.file), { recursive: true });
    const tmp = `${this.file}.${process.pid}.tmp`;
    fs.writeFileSync(tmp, JSON.stringify(this.data, null, 1));
    fs.renameSync(tmp, this.file);
  }
}
