// Local stand-in for a hosted SMTP relay (design.md, "mail"): smtp-server on loopback accepts every message and
// stores it, byte for byte as delivered, as an .eml file under STRUTROOM_DATA_DIR/mail.
//
// Why files and not a table: the fake plays an outside service, so it must not write into the product's database
// (no product table or migration exists only for a fake); an .eml file is exactly what was sent, readable by any
// mail tool, and the owners' dev page and the tests read the folder with mailparser. Files are written under a
// temporary name and renamed, so a reader never sees half a message.
import path from "node:path";
import { randomUUID } from "node:crypto";
import { createWriteStream, mkdirSync, renameSync, rmSync } from "node:fs";
import { pipeline } from "node:stream/promises";
import { SMTPServer } from "smtp-server";

const port = Number(process.env.SMTP_PORT);
const dataDir = process.env.STRUTROOM_DATA_DIR;
if (!port || !dataDir) {
  console.error("The SMTP fake needs SMTP_PORT and STRUTROOM_DATA_DIR (set by scripts/stack/services.mjs).");
  process.exit(1);
}
const mailDir = path.join(dataDir, "mail");
mkdirSync(mailDir, { recursive: true });

const server = new SMTPServer({
  name: "strutroom-smtp-fake",
  authOptional: true,
  disabledCommands: ["STARTTLS", "AUTH"],
  banner: "Strutroom local mail capture",
  size: 10 * 1024 * 1024,
  logger: false,
  onData(stream, session, callback) {
    // Sortable names: capture time first, then a random part so two mails in the same millisecond never collide.
    const name = `${new Date().toISOString().replace(/[:.]/g, "-")}-${randomUUID()}.eml`;
    const partial = path.join(mailDir, `.${name}.part`);
    pipeline(stream, createWriteStream(partial))
      .then(() => {
        if (stream.sizeExceeded) throw Object.assign(new Error("Message exceeds the 10 MB limit"), { responseCode: 552 });
        renameSync(partial, path.join(mailDir, name));
        callback();
      })
      .catch((error) => {
        rmSync(partial, { force: true });
        callback(error);
      });
  },
});

server.on("error", (error) => console.error(`SMTP fake: ${error.message}`));
server.listen(port, "127.0.0.1", () => console.log(`SMTP fake on 127.0.0.1:${port}, captured mail in ${mailDir}`));

const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
