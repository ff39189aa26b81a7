import { z } from 'zod'

export const siteNoteSchema = z.object({
  body: z.string().trim().min(1, 'Write the note.').max(4000, 'At most 4,000 characters.'),
})
