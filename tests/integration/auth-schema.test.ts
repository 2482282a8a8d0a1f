import { describe, expect, it } from 'vitest';
import { getTableColumns, getTableName } from 'drizzle-orm';
import type { SQLiteTable } from 'drizzle-orm/sqlite-core';
import { getAuthTables } from '@better-auth/core/db';
import { getAuth } from '@/lib/auth';
import * as schema from '@/db/schema';

describe('better-auth schema', () => {
  it('has every table and field better-auth expects, with the same required-ness', () => {
    const expected = getAuthTables(getAuth().options);
    const tables = schema as unknown as Record<string, SQLiteTable>;
    for (const [key, table] of Object.entries(expected)) {
      const ours = tables[table.modelName] ?? tables[key];
      expect(ours, `table ${key}`).toBeDefined();
      const columns = getTableColumns(ours);
      for (const [field, attr] of Object.entries(table.fields)) {
        const column = columns[attr.fieldName ?? field];
        expect(column, `${getTableName(ours)}.${field}`).toBeDefined();
        if (attr.required !== false && attr.required) expect(column.notNull, `${field} NOT NULL`).toBe(true);
      }
    }
  });
});
