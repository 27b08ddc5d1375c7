import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { fileStore, folderStore, isPartialName, newStorageKey } from "~/utils/file-store.server";
import { env } from "~/utils/env.server";

const folders: string[] = [];
function freshFolder() {
  const folder = path.join(os.tmpdir(), `plumbline-store-${randomUUID()}`);
  folders.push(folder);
  return folder;
}
afterAll(() => {
  for (const folder of folders) fs.rmSync(folder, { recursive: true, force: true });
});

function bytesOf(length: number, seed: number) {
  return Uint8Array.from({ length }, (_, i) => (i * 31 + seed) % 251);
}

describe("the folder file store", () => {
  it("keeps bytes under a random key, returns them whole and forgets them on remove", async () => {
    const folder = freshFolder();
    const store = folderStore(folder);
    const key = newStorageKey();
    expect(key).toMatch(/^[a-f0-9]{32}$/);
    expect(newStorageKey()).not.toBe(key);
    const bytes = bytesOf(70_000, 3);
    await store.put(key, bytes);
    expect(fs.readdirSync(folder)).toEqual([key]);
    expect(new Uint8Array((await store.get(key))!)).toEqual(bytes);
    await store.remove(key);
    expect(await store.get(key)).toBeNull();
    await expect(store.remove(key)).resolves.toBeUndefined();
    expect(fs.readdirSync(folder)).toEqual([]);
  });

  it("refuses anything but a 32-hex key, so no name can reach outside the folder", async () => {
    const store = folderStore(freshFolder());
    for (const key of ["../escape", "ABCDEF", "", `${newStorageKey()}/x`, `.${newStorageKey()}.partial`]) {
      await expect(store.put(key, bytesOf(4, 1))).rejects.toThrow("Not a storage key.");
      await expect(store.get(key)).rejects.toThrow("Not a storage key.");
      await expect(store.remove(key)).rejects.toThrow("Not a storage key.");
    }
  });

  it("leaves nothing behind when a put fails before the file is in place", async () => {
    const folder = freshFolder();
    const store = folderStore(folder);
    const key = newStorageKey();
    // A folder already standing at the key's name makes the final rename fail.
    fs.mkdirSync(path.join(folder, key), { recursive: true });
    await expect(store.put(key, bytesOf(1000, 5))).rejects.toThrow();
    expect(fs.readdirSync(folder)).toEqual([key]);
    expect(fs.statSync(path.join(folder, key)).isDirectory()).toBe(true);
  });

  it("shows a reader on another server the whole file or nothing while it is being written", async () => {
    const folder = freshFolder();
    const writer = folderStore(folder);
    const reader = folderStore(folder);
    const key = newStorageKey();
    const bytes = Buffer.alloc(4 * 1024 * 1024, "plumbline");
    let done = false;
    const writing = writer.put(key, bytes).finally(() => {
      done = true;
    });
    const seen: Array<number | null> = [];
    while (!done) {
      const got = await reader.get(key);
      seen.push(got ? got.byteLength : null);
      const names = fs.existsSync(folder) ? fs.readdirSync(folder) : [];
      // While writing, the folder holds at most the hidden partial file and, once renamed, the key.
      for (const name of names) expect(name === key || isPartialName(name)).toBe(true);
    }
    await writing;
    expect(seen.every((length) => length === null || length === bytes.byteLength)).toBe(true);
    // Compared as buffers: a deep equality over millions of elements would take minutes.
    expect((await reader.get(key))!.equals(bytes)).toBe(true);
    expect(fs.readdirSync(folder)).toEqual([key]);
  });

  it("lets two servers mounting the same folder read each other's files", async () => {
    const folder = freshFolder();
    const a = folderStore(folder);
    const b = folderStore(folder);
    const keys = [newStorageKey(), newStorageKey(), newStorageKey(), newStorageKey()];
    await Promise.all(keys.map((key, i) => (i % 2 ? a : b).put(key, bytesOf(5000 + i, i))));
    for (const [i, key] of keys.entries())
      expect(new Uint8Array((await (i % 2 ? b : a).get(key))!)).toEqual(bytesOf(5000 + i, i));
    expect(fs.readdirSync(folder).sort()).toEqual([...keys].sort());
  });

  it("is the folder UPLOAD_DIR by default", async () => {
    const key = newStorageKey();
    await fileStore().put(key, bytesOf(10, 9));
    expect(new Uint8Array(fs.readFileSync(path.join(env.uploadDir, key)))).toEqual(bytesOf(10, 9));
    await fileStore().remove(key);
    expect(fs.existsSync(path.join(env.uploadDir, key))).toBe(false);
  });
});

describe("partial files left by interrupted writes", () => {
  const hoursAgo = (hours: number) => new Date(Date.now() - hours * 3_600_000);

  it("are swept once they are older than the cut-off; stored files and young partials stay", async () => {
    const folder = freshFolder();
    const store = folderStore(folder);
    const key = newStorageKey();
    await store.put(key, bytesOf(1_000, 5));
    const old = path.join(folder, `.${newStorageKey()}.0a0b0c0d0e0f.partial`);
    const young = path.join(folder, `.${newStorageKey()}.101112131415.partial`);
    fs.writeFileSync(old, bytesOf(10, 1));
    fs.writeFileSync(young, bytesOf(10, 2));
    // The old one as a crash two hours ago would leave it; the stored file is just as old.
    fs.utimesSync(old, hoursAgo(2), hoursAgo(2));
    fs.utimesSync(path.join(folder, key), hoursAgo(2), hoursAgo(2));
    expect(isPartialName(path.basename(old))).toBe(true);

    expect(await store.sweepPartials(hoursAgo(1))).toBe(1);
    expect(fs.readdirSync(folder).sort()).toEqual([key, path.basename(young)].sort());
    expect(new Uint8Array((await store.get(key))!)).toEqual(bytesOf(1_000, 5));
    expect(await store.sweepPartials(hoursAgo(1))).toBe(0);
  });

  it("are nothing to sweep in a folder that does not exist yet", async () => {
    expect(await folderStore(freshFolder()).sweepPartials(new Date())).toBe(0);
  });
});
