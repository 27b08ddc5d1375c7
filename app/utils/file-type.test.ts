import { describe, expect, it } from "vitest";
import { fileKindProblem, sniffFileKind } from "~/utils/file-type";

const bytes = (...values: number[]) => new Uint8Array(values);
const text = (s: string) => new TextEncoder().encode(s);

describe("file kinds by content", () => {
  it("knows PDF, PNG and JPEG by their magic numbers", () => {
    expect(sniffFileKind(text("%PDF-1.7\n%...")).kind).toBe("pdf");
    expect(sniffFileKind(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0)).kind).toBe("png");
    expect(sniffFileKind(bytes(0xff, 0xd8, 0xff, 0xe0, 0, 0x10)).kind).toBe("jpeg");
  });

  it("takes plain UTF-8 text as CSV, and refuses text with control bytes or broken UTF-8", () => {
    expect(sniffFileKind(text("item_code,kind\r\nKR-1,shackle\r\nÉtrier,shackle\n")).kind).toBe("csv");
    expect(sniffFileKind(bytes(0x61, 0x2c, 0x00, 0x62)).kind).toBeNull();
    expect(sniffFileKind(bytes(0x61, 0xc3, 0x28)).kind).toBeNull();
  });

  it("names executables and archives so the refusal says what they are", () => {
    expect(sniffFileKind(bytes(0x7f, 0x45, 0x4c, 0x46, 2, 1, 1))).toEqual({
      kind: null,
      description: "a Linux program (ELF)",
    });
    expect(sniffFileKind(bytes(0x4d, 0x5a, 0x90, 0))).toEqual({
      kind: null,
      description: "a Windows program (EXE/DLL)",
    });
    expect(sniffFileKind(bytes(0x50, 0x4b, 0x03, 0x04))).toMatchObject({ description: expect.stringContaining("ZIP") });
    expect(sniffFileKind(new Uint8Array())).toMatchObject({ kind: null, description: "an empty file" });
  });

  it("refuses a PNG named .pdf where a PDF is needed, naming what it really is", () => {
    const png = sniffFileKind(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a));
    expect(fileKindProblem(png, ["pdf"], "certificate.pdf")).toBe(
      '"certificate.pdf" is a PNG image by its content, whatever its name says; this needs a PDF.',
    );
    expect(fileKindProblem(png, ["pdf", "png", "jpeg"], "drawing.pdf")).toBeNull();
  });
});
