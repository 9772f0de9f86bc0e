/**
 * How a record's heads move when a revision arrives, kept apart from any SQL engine so every
 * engine applies the same rule. A revision replaces the heads it names; heads it does not name
 * stay, and then the record has more than one head: a conflict that keeps both edits.
 */

/**
 * `replaces` may name revisions that are no longer heads (already replaced) or that this server
 * never saw (a server restored from an older backup); both are ignored rather than refused, so a
 * phone's edit is never turned away for its history.
 */
export function headsAfter(
  current: readonly string[],
  replaces: readonly string[],
  added: string,
): string[] {
  return [...current.filter((h) => !replaces.includes(h) && h !== added), added];
}
