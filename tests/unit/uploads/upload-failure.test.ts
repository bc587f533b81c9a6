// Refused or stopped: the upload widget offers no retry for a file the server refuses (status
// classes per RFC 9110 section 15.5; which of Cairn's answers are refusals is Cairn's own rule,
// components/upload/upload-failure.ts).
import { describe, expect, it } from "vitest";
import { classifyUploadFailure } from "@/components/upload/upload-failure";

describe("classifyUploadFailure", () => {
  it("reads the server's refusal of the file as refused, with its reason", () => {
    for (const status of [400, 403, 413, 415, 422]) {
      expect(classifyUploadFailure(status, "“a.264” was not stored: it is text, not a recording", "x")).toEqual({ kind: "refused", reason: "“a.264” was not stored: it is text, not a recording" });
    }
  });
  it("keeps stops that a retry or a new session can cure as stopped", () => {
    for (const status of [401, 404, 408, 409, 410, 423, 429, 500, 502, 503]) expect(classifyUploadFailure(status, "busy", "x").kind).toBe("stopped");
    expect(classifyUploadFailure(undefined, null, "The connection dropped")).toEqual({ kind: "stopped", reason: "The connection dropped" });
  });
  it("does not call a 4xx without Cairn's message a refusal (a proxy's page, not Cairn's verdict)", () => {
    expect(classifyUploadFailure(422, null, "Request failed")).toEqual({ kind: "stopped", reason: "Request failed" });
  });
});
