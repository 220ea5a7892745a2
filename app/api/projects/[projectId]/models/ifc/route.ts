import { readBodyBytes } from "@/lib/http/body-bytes";
import { ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { readIfcRoof } from "@/lib/ifc";
import { IFC_UPLOAD_BYTES } from "@/lib/ifc/schemas";

/**
 * Reads the roof of an IFC file (the request body) into our model format and answers it with notes; every problem
 * is a 400 listing them all. Nothing is stored: the client saves the model as a revision through POST …/models.
 */
export const POST = projectRoute({ params: projectParamsSchema, action: "model.edit" }, async ({ request }) => {
  const read = await readIfcRoof(await readBodyBytes(request, IFC_UPLOAD_BYTES));
  if ("message" in read) throw new ValidationError([{ path: read.where, message: read.message }], read.message);
  if (!read.model) {
    throw new ValidationError(
      read.problems.map((p) => ({ path: p.where, message: p.message })),
      `The IFC roof has ${read.problems.length} problem${read.problems.length === 1 ? "" : "s"}; nothing was read.`,
    );
  }
  return Response.json({ model: read.model, source: read.source, notes: read.notes });
});
