import { createColumnHelper, rowPaginationFeature, rowSortingFeature, tableFeatures, type RowData } from '@tanstack/react-table';

export interface DataColumnMeta {
  /** Right-aligned tabular figures for numeric columns. */
  numeric?: boolean;
  /** Extra classes for the cells of this column. */
  className?: string;
}

/**
 * The features every server-driven list uses: sorting and pagination are owned by
 * the server (manual mode), the table only renders one page.
 */
export const dataTableFeatures = tableFeatures({
  rowSortingFeature,
  rowPaginationFeature,
  columnMeta: {} as DataColumnMeta,
});

export type DataTableFeatures = typeof dataTableFeatures;

export function createDataColumnHelper<TData extends RowData>() {
  return createColumnHelper<DataTableFeatures, TData>();
}
