// Column types SQLite gives back: timestamps as ISO-8601 text, booleans as 0/1.

/** ISO-8601 UTC timestamp stored as text. */
export type Timestamp = string
export type Flag = 0 | 1
