import { describe, expect, it } from "vitest";
import { oversizeMessage } from "~/components/ui/file-size";

describe("files refused in the browser before they are sent", () => {
  const MB = 1024 * 1024;
  it("names the first file over the limit, with its size and the limit", () => {
    expect(oversizeMessage([{ name: "cert.pdf", size: 30 * MB }], 10 * MB)).toBe(
      "cert.pdf is 30.0 MB: the limit is 10 MB. Choose a smaller file.",
    );
    expect(
      oversizeMessage(
        [
          { name: "a.jpg", size: 2 * MB },
          { name: "b.jpg", size: 11 * MB },
        ],
        10 * MB,
      ),
    ).toContain("b.jpg");
  });
  it("passes files at or under the limit, and no file at all", () => {
    expect(oversizeMessage([{ name: "ok.pdf", size: 10 * MB }], 10 * MB)).toBe("");
    expect(oversizeMessage(null, 10 * MB)).toBe("");
    expect(oversizeMessage([], 10 * MB)).toBe("");
  });
});
