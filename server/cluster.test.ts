// A PUBLISH the streams adapter fires and forgets must not end the process when Redis fails it: Node ends a process
// on an unhandled promise rejection (Node.js docs, --unhandled-rejections, default "throw" since Node 15); vitest
// fails a test run on one too, so this test fails if the failure escapes.
import { afterEach, describe, expect, it, vi } from "vitest";
import { withPublishFailuresLogged } from "./cluster";

afterEach(() => vi.restoreAllMocks());

describe("withPublishFailuresLogged", () => {
  it("logs a failed publish nobody waits for, still rejects for a caller that waits, and passes other calls through", async () => {
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const client = {
      channel: "strutroom",
      publish(channel: string): Promise<number> {
        return Promise.reject(new Error(`timeout on ${channel}`));
      },
      duplicate() {
        return this.channel;
      },
    };
    const wrapped = withPublishFailuresLogged(client);
    void wrapped.publish("fire-and-forget");
    await expect(wrapped.publish("awaited")).rejects.toThrow("timeout on awaited");
    await new Promise((resolve) => setImmediate(resolve));
    expect(logged).toHaveBeenCalledWith("[realtime] a message to the other nodes was not sent:", "timeout on fire-and-forget");
    expect(wrapped.duplicate()).toBe("strutroom");
  });
});
