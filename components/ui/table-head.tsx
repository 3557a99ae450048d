import type { ReactNode } from "react";

/** A column heading; `end` for numbers, which line up at the end of the cell. */
export type Column = ReactNode | { label: ReactNode; end: true };

const isEnd = (c: Column): c is { label: ReactNode; end: true } => typeof c === "object" && c !== null && "end" in c;

/** The one look of a data table's heading row (`dense` for the admin lists, whose cells are p-2). */
export function TableHead({ columns, dense = false }: { columns: Column[]; dense?: boolean }) {
  const pad = dense ? "p-2" : "p-3";
  return (
    <thead className="bg-paper-sunk">
      <tr>
        {columns.map((c, i) => (
          <th key={i} scope="col" className={`${pad} ${isEnd(c) ? "text-end" : "text-start"}`}>
            {isEnd(c) ? c.label : c}
          </th>
        ))}
      </tr>
    </thead>
  );
}
