/** One column of an import template (shared by the value and the catalogue kinds). */
export interface ColumnDef {
  /** Our column name, exactly as in the template header. */
  key: string;
  required: boolean;
  /** Other header spellings the auto-mapping recognises (compared after normalisation). */
  aliases: readonly string[];
  description: string;
}

/** Reads one cell of the current row by column key; undefined when the column is absent. */
export type CellReader = (key: string) => string | undefined;
