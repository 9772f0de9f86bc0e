/** "1 colony", "2 colonies": a count with its noun in the right number. */
export function counted(n: number, one: string, many: string): string {
  return `${n.toLocaleString('en')} ${n === 1 ? one : many}`;
}
