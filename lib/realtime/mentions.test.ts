import { describe, expect, it } from "vitest";
import { findMentions } from "./mentions";

const members = [
  { id: "a", name: "Amara Okafor", email: "architect@northfield-demo.test" },
  { id: "t", name: "Tomasz Reiner", email: "structural@northfield-demo.test" },
  { id: "l", name: "Lucas Ferreira", email: "mep@northfield-demo.test" },
];

describe("findMentions", () => {
  it("finds full names, first names and e-mail local parts, case-insensitively", () => {
    expect(findMentions("@Amara Okafor can the duct pass here?", members)).toEqual(["a"]);
    expect(findMentions("thoughts @tomasz?", members)).toEqual(["t"]);
    expect(findMentions("cc @mep and @Structural", members)).toEqual(["t", "l"]);
  });

  it("ignores e-mail addresses and names that only start with a handle", () => {
    expect(findMentions("write to someone@Amara.test", members)).toEqual([]);
    expect(findMentions("@Amaranth is not a member", members)).toEqual([]);
    expect(findMentions("no mention here, Amara", members)).toEqual([]);
  });

  it("lists each member once", () => {
    expect(findMentions("@Amara @Amara Okafor @architect", members)).toEqual(["a"]);
  });
});

describe("findMentions with shared first names", () => {
  it("lets the longest handle win at each @", () => {
    const twins = [
      { id: "1", name: "Amara Okafor", email: "a1@x.test" },
      { id: "2", name: "Amara Lind", email: "a2@x.test" },
    ];
    expect(findMentions("@Amara Lind please check", twins)).toEqual(["2"]);
    expect(findMentions("@Amara please check", twins)).toEqual(["1", "2"]);
  });
});
