/** Thrown for an invalid coil spec or target; `field` is the dotted path of the bad field. */
export class CoilSpecError extends Error {
  readonly field: string;
  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = 'CoilSpecError';
    this.field = field;
  }
}
