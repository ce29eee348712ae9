/** A column of AppDataTable: `value` gives what it sorts by (default: the row's field of that id). */
export type DataColumn<R> = { id: string, header: string, value?: (row: R) => unknown, sortable?: boolean, class?: string }

/** One choice in AppCombobox. */
export type ComboOption = { id: string, label: string, hint?: string }
