// Impulse test records: one application of an impulse at a level, with or without a spark.
export interface ImpulseApplication {
  /** Applied (prospective) impulse level in kV, as the laboratory reports it. */
  levelKv: number
  spark: boolean
}
