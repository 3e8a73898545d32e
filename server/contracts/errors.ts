/** The one error envelope every failing API response carries. */
export type ErrorEnvelope = {
  error: {
    code: string;
    message: string;
    /** The first failing input field, dotted (`turbine.inletTemperatureK`). */
    field?: string;
    fieldErrors?: Record<string, string[]>;
    requestId?: string;
  };
};
