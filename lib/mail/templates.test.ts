import { simpleParser } from "mailparser";
import nodemailer from "nodemailer";
import { describe, expect, it } from "vitest";
import { clashStepMail, decisionMail, digestMail, invitationMail, mentionMail, STANDING_CAUTION } from "./templates";

// Round trip through nodemailer's own MIME builder and mailparser (general-purpose npm libraries), so the check is
// what a mail client would show, not our string.
async function asReceived(mail: { subject: string; text: string; html: string }) {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true });
  const info = await transport.sendMail({ from: "a@strutroom.test", to: "b@strutroom.test", ...mail });
  return simpleParser(info.message as Buffer);
}

describe("mail templates", () => {
  it("invitation carries the join link in both parts and names the role", async () => {
    const joinUrl = "http://127.0.0.1:3000/join/abc123?x=1&y=2";
    const mail = invitationMail({ projectName: "Northfield sports hall", inviterName: "Ines Marlow", role: "mep_engineer", joinUrl, expiresAt: new Date("2026-12-08T12:00:00Z") });
    const parsed = await asReceived(mail);
    expect(parsed.subject).toBe("Ines Marlow invited you to Northfield sports hall on Strutroom");
    expect(parsed.text).toContain(joinUrl);
    expect(parsed.text).toContain('with the role "MEP engineer"');
    expect(parsed.html).toContain('href="http://127.0.0.1:3000/join/abc123?x=1&amp;y=2"');
  });

  it("escapes user text in the HTML part", async () => {
    const mail = mentionMail({ projectName: "P", byName: "Amara", pinTitle: "<script>x</script>", excerpt: "a & b", pinUrl: "http://h/p" });
    expect(mail.html).not.toContain("<script>");
    expect(mail.html).toContain("&lt;script&gt;");
    expect(mail.text).toContain("“a & b”");
  });

  it("decision mails carry the standing caution", () => {
    const mail = decisionMail({ projectName: "P", deciderName: "Tomasz Reiner", subject: "clash C-12", outcome: "opening accepted with conditions", note: "Sleeve max 150 mm", url: "http://h" });
    expect(mail.subject).toBe("Decision on clash C-12: opening accepted with conditions (P)");
    expect(mail.text).toContain(STANDING_CAUTION);
    expect(mail.html).toContain("engineer of record");
  });

  it("clash mails say a proposal is a proposal and a decision is a decision (issue 16)", () => {
    const base = { projectName: "P", actorName: "Ines Marlow", subject: "clash K1 (member D-1, run SA-01)", url: "http://h" };
    const proposal = clashStepMail({ ...base, step: "proposal", outcome: "opening proposed", details: [] });
    expect(proposal.subject).toBe("Proposed on clash K1 (member D-1, run SA-01): opening proposed (P)");
    expect(proposal.text).toContain("This is a proposal, not a decision");
    expect(proposal.subject).not.toMatch(/decision/i);
    const decision = clashStepMail({ ...base, actorName: "Tomasz Reiner", step: "decision", outcome: "opening refused", details: ["Reason: works under wind uplift."] });
    expect(decision.subject).toBe("Decided on clash K1 (member D-1, run SA-01): opening refused (P)");
    expect(decision.text).not.toContain("This is a proposal");
    expect(decision.text).toContain(STANDING_CAUTION);
    const recheck = clashStepMail({ ...base, actorName: null, step: "recheck", outcome: null, details: ["D-1 now carries 12.4 kN."] });
    expect(recheck.text).toContain("needs another look");
    const closure = clashStepMail({ ...base, actorName: null, step: "closure", outcome: "opening accepted with conditions", details: ["The decision no longer holds: run SA-01 was moved or resized in revision 2."] });
    expect(closure.subject).toBe("Decision closed on clash K1 (member D-1, run SA-01): opening accepted with conditions (P)");
    expect(closure.text).toContain("The decision on clash K1 (member D-1, run SA-01) in P no longer holds: opening accepted with conditions.");
    expect(closure.text).toContain(STANDING_CAUTION);
  });

  it("digest lists each thread with its state and age", () => {
    const mail = digestMail({
      projectName: "P",
      recipientName: "Ines",
      projectUrl: "http://h/p",
      threads: [
        { title: "Duct at grid C", state: "open", ageDays: 3, lastBy: "Lucas Ferreira", url: "http://h/1" },
        { title: "Gutter", state: "answered", ageDays: 1, lastBy: null, url: "http://h/2" },
      ],
    });
    expect(mail.subject).toBe("2 open threads in P");
    expect(mail.text).toContain("- Duct at grid C — open, 3 days, last comment by Lucas Ferreira: http://h/1");
    expect(mail.text).toContain("- Gutter — answered, 1 day: http://h/2");
  });
});
