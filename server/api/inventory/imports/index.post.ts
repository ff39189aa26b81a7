// POST /api/inventory/imports — upload an XLSX or CSV file (multipart field `file`); returns the preview:
// counts of new, changed and unchanged rows and every row error. Nothing is written to the inventory yet.
import { MAX_IMPORT_BYTES } from '~~/shared/inventory-layout'
import { previewUpload } from '~~/server/inventory/uploads'

const TOO_BIG = `The file is larger than ${MAX_IMPORT_BYTES / 1024 / 1024} MB, the limit. Split it into several files.`

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (declared > MAX_IMPORT_BYTES + 64 * 1024) throw createError({ statusCode: 413, statusMessage: TOO_BIG })
  const parts = await readMultipartFormData(event).catch(() => undefined)
  const file = parts?.find(p => p.name === 'file' && p.filename !== undefined)
  if (!file) badRequest('Choose a file to upload (an .xlsx workbook or a .csv file).')
  if (file.data.length > MAX_IMPORT_BYTES) throw createError({ statusCode: 413, statusMessage: TOO_BIG })
  // Names and types come from the client: no NUL (PostgreSQL text cannot hold it), bounded length.
  const clean = (text: string | undefined, fallback: string) => (text ?? '').replaceAll('\u0000', '').slice(0, 255) || fallback
  const preview = await previewUpload(event, member, { fileName: clean(file.filename, 'upload'), contentType: clean(file.type, 'application/octet-stream'), data: file.data })
  setResponseStatus(event, 201)
  return preview
})
