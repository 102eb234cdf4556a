/**
 * Column shapes the tables share (Drizzle's reusable-column pattern): each call makes the same column as
 * writing it out, so the SQL and the migrations do not change.
 */
import { integer, text, type AnySQLiteColumn } from 'drizzle-orm/sqlite-core';

/** An instant, as milliseconds since 1970 (read and written as a Date). */
export const instant = () => integer({ mode: 'timestamp_ms' });

/** A row that belongs to the row `to` points at: required, and deleted with it. */
export const refCascade = (to: () => AnySQLiteColumn) => text().notNull().references(to, { onDelete: 'cascade' });

/** An optional pointer (who made or changed a row, a link it came through) that becomes null when its target goes. */
export const refSetNull = (to: () => AnySQLiteColumn) => text().references(to, { onDelete: 'set null' });
