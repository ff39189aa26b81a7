// A request address longer than 4,096 characters is answered 414 here, before any route (or error
// page) could echo it back. Answered directly rather than thrown: an error response would repeat
// the address in its `url` field.
const MAX_ADDRESS_LENGTH = 4096

export default defineEventHandler((event) => {
  if (event.path.length <= MAX_ADDRESS_LENGTH) return
  setResponseStatus(event, 414, 'URI Too Long')
  return { statusCode: 414, statusMessage: `The address is longer than ${MAX_ADDRESS_LENGTH} characters.` }
})
