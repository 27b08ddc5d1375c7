// Where the bytes of uploaded files live, behind three calls: put, get and remove by a random key. The one store
// today is a folder (UPLOAD_DIR). Several app servers share it by mounting the same volume (NFS, SMB) at the same
// path on each, so a file stored through one server is read through any other.
import { randomBytes } from "node:crypto";
import fs from "node:fs/promises";
import path from "node:path";
import { env } from "~/utils/env.server";

export type FileStore = {
  /** Stores `bytes` under `key`; once it resolves, every server reads the whole file, never a part of it. */
  put(key: string, bytes: Uint8Array): Promise<void>;
  /** The bytes stored under `key`, or null when there are none. */
  get(key: string): Promise<Buffer | null>;
  /** Forgets `key`; nothing happens when it is not stored. */
  remove(key: string): Promise<void>;
  /**
   * Removes the partial files of writes that began before `before` (a put takes well under a second, so an old one
   * is what a crash or a killed server left behind); answers how many it removed.
   */
  sweepPartials(before: Date): Promise<number>;
};

/** How old a partial file must be before it counts as left behind by a write that never finished. */
export const ABANDONED_PARTIAL_MS = 60 * 60 * 1000;

const STORAGE_KEY = /^[a-f0-9]{32}$/;

/** A fresh random key (128 bits, 32 hex digits): never guessed, never the same as another server's. */
export function newStorageKey(): string {
  return randomBytes(16).toString("hex");
}

function checkedKey(key: string) {
  if (!STORAGE_KEY.test(key)) throw new Error("Not a storage key.");
  return key;
}

/** Whether a name in the folder is a write still in progress (or one a crash left behind): never a stored file. */
export function isPartialName(name: string) {
  return name.startsWith(".") && name.endsWith(".partial");
}

function isMissing(error: unknown) {
  return (error as NodeJS.ErrnoException | null)?.code === "ENOENT";
}

/** Makes a rename inside `folder` durable where the file system allows it; some (SMB, Windows) refuse, harmlessly. */
async function syncFolder(folder: string) {
  let handle: fs.FileHandle | undefined;
  try {
    handle = await fs.open(folder, "r");
    await handle.sync();
  } catch {
    // Not every file system lets a folder be opened or synced; the rename itself is still atomic.
  } finally {
    await handle?.close().catch(() => undefined);
  }
}

/**
 * A store in a local or mounted folder. A put writes to a hidden partial name in the same folder (so the rename
 * stays on one file system), flushes it to disk, then renames it to the key: a reader on any server sees the
 * whole file or none. A failed put removes its partial file.
 */
export function folderStore(folder: string): FileStore {
  const root = path.resolve(folder);
  const pathOf = (key: string) => path.join(root, checkedKey(key));
  return {
    async put(key, bytes) {
      const target = pathOf(key);
      await fs.mkdir(root, { recursive: true });
      const partial = path.join(root, `.${key}.${randomBytes(6).toString("hex")}.partial`);
      try {
        const handle = await fs.open(partial, "wx", 0o640);
        try {
          await handle.writeFile(bytes);
          await handle.sync();
        } finally {
          await handle.close();
        }
        await fs.rename(partial, target);
      } catch (error) {
        await fs.rm(partial, { force: true }).catch(() => undefined);
        throw error;
      }
      await syncFolder(root);
    },
    async get(key) {
      try {
        return await fs.readFile(pathOf(key));
      } catch (error) {
        if (isMissing(error)) return null;
        throw error;
      }
    },
    async remove(key) {
      await fs.rm(pathOf(key), { force: true });
    },
    async sweepPartials(before) {
      let names: string[];
      try {
        names = await fs.readdir(root);
      } catch (error) {
        if (isMissing(error)) return 0;
        throw error;
      }
      let removed = 0;
      for (const name of names.filter(isPartialName)) {
        const file = path.join(root, name);
        try {
          if ((await fs.stat(file)).mtimeMs >= before.getTime()) continue;
          await fs.rm(file, { force: true });
          removed++;
        } catch (error) {
          // Renamed or removed meanwhile (by its own put or another server's sweep): nothing to do.
          if (!isMissing(error)) throw error;
        }
      }
      return removed;
    },
  };
}

/**
 * Clears partial files that writes interrupted at least an hour ago left in the app's store; run once as the
 * server starts. Never fails the start: a store it cannot read is reported and left for the uploads to refuse.
 */
export async function sweepAbandonedPartials(now = new Date()) {
  try {
    const removed = await fileStore().sweepPartials(new Date(now.getTime() - ABANDONED_PARTIAL_MS));
    if (removed > 0) console.log(`Removed ${removed} partial upload file(s) left by interrupted writes.`);
  } catch (error) {
    console.error(
      `The upload folder could not be swept of partial files: ${error instanceof Error ? error.message : String(error)}`,
    );
  }
}

/** The app's file store: the folder UPLOAD_DIR. */
export function fileStore(): FileStore {
  return folderStore(env.uploadDir);
}
