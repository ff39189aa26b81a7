// Input that a calibration cannot use: one readable line per problem, shown to the analyst as is.
export class CalibrationInputError extends Error {
  readonly issues: string[]
  constructor(issues: string[] | string) {
    const list = Array.isArray(issues) ? issues : [issues]
    super(list.join(' '))
    this.name = 'CalibrationInputError'
    this.issues = list
  }
}
