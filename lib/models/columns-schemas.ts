// Route params of the result-columns, member-detail and node-detail endpoints.
import { z } from "zod";
import { ids } from "@/lib/limits";
import { revisionParamsSchema } from "./schemas";

const elementId = z.string().min(1).max(ids.elementIdChars);

export const resultColumnsParamsSchema = revisionParamsSchema.extend({ resultId: elementId });
export const memberDetailParamsSchema = revisionParamsSchema.extend({ memberId: elementId });
export const nodeDetailParamsSchema = revisionParamsSchema.extend({ nodeId: elementId });
