import type { ListParams } from '@/lib/catalog/list-params';

/** The catalogue list queries take the UI's list state; the API pages in a fixed order. */
export function catalogPage(page: { page: number; size: number }): ListParams {
  return { page: page.page, size: page.size, dir: 'asc', retracted: false, sort: undefined, q: undefined, tag: undefined, system: undefined };
}
