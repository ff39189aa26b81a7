// One page of a list: the rows to skip and take for a 1-based page, and the page facts the lists return.
export interface PageRequest { page: number, pageSize: number }

/** `limit` / `offset` of a 1-based page. */
export function pageWindow({ page, pageSize }: PageRequest): { limit: number, offset: number } {
  return { limit: pageSize, offset: (page - 1) * pageSize }
}
