import os from "node:os";
import { describe, expect, it } from "vitest";
import { DEV_SESSION_SECRET, parseEnvironment } from "~/utils/env.server";

const productionBase = {
  NODE_ENV: "production",
  SESSION_SECRET: "a".repeat(40),
  SMTP_URL: "smtp://mail.test.invalid:587",
  PUBLIC_URL: "https://plumbline.test.invalid",
};

describe("configuration", () => {
  it("production refuses to start on the development session secret", () => {
    expect(() => parseEnvironment({ ...productionBase, SESSION_SECRET: undefined })).toThrow(
      /SESSION_SECRET must be set/,
    );
    expect(() => parseEnvironment({ ...productionBase, SESSION_SECRET: DEV_SESSION_SECRET })).toThrow(/SESSION_SECRET/);
    expect(() => parseEnvironment({ ...productionBase, SESSION_SECRET: "short" })).toThrow(/at least 32 characters/);
  });

  it("production needs a real mail server and its public address", () => {
    expect(() => parseEnvironment({ ...productionBase, SMTP_URL: undefined })).toThrow(/SMTP_URL/);
    expect(() => parseEnvironment({ ...productionBase, PUBLIC_URL: undefined })).toThrow(/PUBLIC_URL/);
  });

  it("a complete production configuration starts, with rotating secrets", () => {
    const env = parseEnvironment({ ...productionBase, SESSION_SECRET: `${"n".repeat(32)},${"o".repeat(32)}` });
    expect(env.isProduction).toBe(true);
    expect(env.sessionSecrets).toHaveLength(2);
  });

  it("the demo runs on the built server without production's requirements", () => {
    const env = parseEnvironment({ NODE_ENV: "production", PLUMBLINE_ENV: "demo" });
    expect(env.appEnv).toBe("demo");
    expect(env.isProduction).toBe(false);
    expect(env.databasePath).toBe("data/plumbline.sqlite");
  });

  it("names the bad variable", () => {
    expect(() => parseEnvironment({ PORT: "eighty" })).toThrow(/PORT/);
    expect(() => parseEnvironment({ WEB_CONCURRENCY: "0" })).toThrow(/WEB_CONCURRENCY/);
    expect(() => parseEnvironment({ WEB_CONCURRENCY: "two" })).toThrow(/WEB_CONCURRENCY/);
  });

  it("gives the production server its address and one worker per core unless told", () => {
    const defaults = parseEnvironment({});
    expect(defaults).toMatchObject({ port: 3000, host: undefined, webConcurrency: os.availableParallelism() });
    expect(parseEnvironment({ HOST: "" }).host).toBeUndefined();
    expect(parseEnvironment({ HOST: "127.0.0.1", PORT: "8080", WEB_CONCURRENCY: "3" })).toMatchObject({
      host: "127.0.0.1",
      port: 8080,
      webConcurrency: 3,
    });
  });
});
