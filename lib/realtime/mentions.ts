// Mentions in comment bodies: "@Amara Okafor", "@Amara" or "@amara.okafor" (the e-mail's local part) name a
// project member. Pure function, shared by the server (notifications) and the client (highlighting).

export type MentionCandidate = { id: string; name: string; email: string };

function handlesOf(member: MentionCandidate): string[] {
  const name = member.name.trim();
  const first = name.split(/\s+/)[0] ?? "";
  const local = member.email.split("@")[0] ?? "";
  return [name, first, local].filter((handle) => handle.length > 0);
}

/**
 * Ids of the members named with @ in the body, in member order, each once. At each "@" the longest matching
 * handle wins, so "@Amara Okafor" names Amara Okafor and not every other Amara.
 */
export function findMentions(body: string, members: readonly MentionCandidate[]): string[] {
  const found = new Set<string>();
  const lower = body.toLowerCase();
  for (let at = lower.indexOf("@"); at >= 0; at = lower.indexOf("@", at + 1)) {
    // An "@" inside a word is an e-mail address, not a mention.
    if (at > 0 && /[\w@]/u.test(lower[at - 1])) continue;
    const rest = lower.slice(at + 1);
    let best = 0;
    let named: string[] = [];
    for (const member of members) {
      for (const handle of handlesOf(member)) {
        const h = handle.toLowerCase();
        const standsAlone = rest.startsWith(h) && !/[\w]/u.test(rest[h.length] ?? "");
        if (!standsAlone || h.length < best) continue;
        if (h.length > best) named = [];
        best = h.length;
        named.push(member.id);
      }
    }
    for (const id of named) found.add(id);
  }
  return members.filter((member) => found.has(member.id)).map((member) => member.id);
}
