// `npm run db:seed`: the idempotent demo (run by `npm start` and before the browser tests). Each area adds its
// own step as a function in scripts/seed/*.ts, called below inside the one transaction. It runs with tsx
// --conditions=react-server, so seed steps may call the "server-only" data layer (db/queries) and commands (lib/commands).
import { closeDb, withTransaction } from "../db/client";
import { analyseDemoRoof, seedDemoModel } from "./seed/demo-model";
import { seedDemoRuns } from "./seed/demo-runs";
import { DEMO_DESIGN_STANDARD, DEMO_PROJECT, seedDemoProject, seedDemoTeam } from "./seed/demo-team";

async function main() {
  const analysed = analyseDemoRoof(DEMO_DESIGN_STANDARD);
  await withTransaction(async (tx) => {
    const { projectId } = await seedDemoProject(tx);
    const team = await seedDemoTeam(tx, projectId);
    await seedDemoModel(tx, { projectId, createdBy: team.structural_engineer, analysed });
    await seedDemoRuns(tx, { projectId, createdBy: team.mep_engineer });
  });
  console.log(`[seed] demo project "${DEMO_PROJECT}" is ready`);
}

main()
  .catch((error) => {
    console.error(`[seed] failed: ${error instanceof Error ? error.message : error}`);
    process.exitCode = 1;
  })
  .finally(closeDb);
