/** An identifier in SQL-standard double quotes, as SQLite and PostgreSQL both read it. */
export function quoteName(name: string): string {
  return `"${name.replaceAll('"', '""')}"`
}
