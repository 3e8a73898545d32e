/**
 * The one error the engine throws on input it cannot compute: a value that is physically
 * impossible or outside the range where the property data hold. `field` is the dotted
 * input path (`turbine.inletTemperatureK`), `message` says why in plain words.
 */
export class EngineInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'EngineInputError';
    this.field = field;
  }
}
