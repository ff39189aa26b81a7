// Storm feeds and alerts: the shapes forms and routes share.
import { z } from 'zod'

export const stormFeedSchema = z.object({
  name: z.string().trim().min(1, 'Name the feed (e.g. the provider).').max(120, 'Keep the name within 120 characters.'),
})

export const stormAlertSettingsSchema = z.object({
  /** Probability 0–1 of ignition in one window at which a tank is alerted; null: alerts off. */
  ignitionThreshold: z.number().gt(0, 'The threshold must be above 0.').lte(1, 'The threshold is a probability, at most 1.').nullable(),
})

export const stormAlertSubscriptionSchema = z.object({ subscribed: z.boolean() })

export type StormFeedInput = z.infer<typeof stormFeedSchema>
export type StormAlertSettingsInput = z.infer<typeof stormAlertSettingsSchema>
