/**
 * Input that fits the schema but breaks a rule of the domain (degenerate geometry, a position
 * outside its row, an inconsistent rule). The message is for the user; `path` names the item.
 */
export class DomainError extends Error {
  override name = 'DomainError';
  constructor(
    message: string,
    readonly path: (string | number)[] = [],
  ) {
    super(message);
  }
}
