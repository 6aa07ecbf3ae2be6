import { z } from "zod";

/**
 * What a season statement covers: the whole farm or one field, over a water year (the year it starts in)
 * or a crop season (the plantings with that season's name). Neither given: the current water year.
 */
export const statementSelectionShape = {
  fieldId: z.uuid("Choose the field by its id").optional(),
  waterYear: z.coerce
    .number({ error: "The water year must be a year, e.g. 2026" })
    .int("The water year must be a whole year, e.g. 2026")
    .min(1900, "The water year must fall between 1900 and 2199")
    .max(2199, "The water year must fall between 1900 and 2199")
    .optional(),
  season: z.string().trim().min(1, "Name the crop season, e.g. 2026-27").max(40, "A season's name has at most 40 characters").optional(),
};

function oneKindOfPeriod(v: { waterYear?: number; season?: string }, ctx: z.RefinementCtx): void {
  if (v.waterYear !== undefined && v.season !== undefined) {
    ctx.addIssue({ code: "custom", path: ["season"], message: "Choose a water year or a crop season, not both" });
  }
}

export const statementQuerySchema = z
  .object({ ...statementSelectionShape, format: z.enum(["json", "csv", "pdf"], "The format is json, csv or pdf").default("json") })
  .superRefine(oneKindOfPeriod);
export type StatementQuery = z.infer<typeof statementQuerySchema>;
export type StatementSelection = Omit<StatementQuery, "format">;

/** Sending the statement as a PDF by e-mail: to the sender, or to another member of the farm. */
export const statementSendSchema = z
  .strictObject({ ...statementSelectionShape, to: z.email("Enter the e-mail address of a member of this farm").optional() })
  .superRefine(oneKindOfPeriod);
export type StatementSend = z.infer<typeof statementSendSchema>;
