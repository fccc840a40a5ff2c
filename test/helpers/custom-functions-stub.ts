/* A stand-in for Excel's CustomFunctions global, enough for the worksheet
 * functions: Error with code and message, and the ErrorCode values. */
export class StubSheetError extends Error {
  readonly code: string;
  constructor(code: string, message?: string) {
    super(message ?? code);
    this.code = code;
  }
}

export function installCustomFunctionsStub(): void {
  (globalThis as Record<string, unknown>).CustomFunctions = {
    Error: StubSheetError,
    ErrorCode: {
      invalidValue: '#VALUE!',
      invalidNumber: '#NUM!',
      notAvailable: '#N/A',
      divisionByZero: '#DIV/0!',
      nullReference: '#NULL!',
      invalidName: '#NAME?',
      invalidReference: '#REF!',
    },
    associate: () => undefined,
  };
}
