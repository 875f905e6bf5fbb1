/** An input problem the user can fix (bad option, bad file): printed plainly, exit code 2. */
export class CliInputError extends Error {
  readonly exitCode = 2;
  constructor(message: string) {
    super(message);
    this.name = 'CliInputError';
  }
}
