// Mentions in comment bodies: "@Amara Okafor", "@Amara" or "@amara.okafor" (the e-mail's local part) name a
// project member. Pure function, shared by the server (notifications) and the client (highlighting).

export type MentionCandidate = { id: string; name: string; email: string };

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}

function handlesOf(member: MentionCandidate): string[] {
  const name = member.name.trim();
  const first = name.split(/\s+/)[0] ?? "";
  const local = member.email.split("@")[0] ?? "";
  return [name, first, local].filter((handle) => handle.length > 0);
}

/** Ids of the members named with @ in the body, in member order, each once. */
export function findMentions(body: string, members: readonly MentionCandidate[]): string[] {
  const found: string[] = [];
  for (const member of members) {
    const named = handlesOf(member).some((handle) =>
      // The handle must stand alone: not preceded by a word character (e-mail addresses) nor followed by one.
      new RegExp(`(^|[^\\w@])@${escapeRegExp(handle)}(?![\\w])`, "iu").test(body),
    );
    if (named) found.push(member.id);
  }
  return found;
}
