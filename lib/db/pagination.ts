/** Server-side pagination: pages are 1-based, sizes bounded so a crafted URL cannot ask for everything. */
export interface PageRequest {
  page: number;
  pageSize: number;
}

export interface Page<T> {
  rows: T[];
  total: number;
  page: number;
  pageSize: number;
  pageCount: number;
}

export const DEFAULT_PAGE_SIZE = 25;
export const MAX_PAGE_SIZE = 200;

export function normalizePage(request: Partial<PageRequest> = {}): PageRequest {
  const pageSize = Math.min(Math.max(Math.trunc(request.pageSize ?? DEFAULT_PAGE_SIZE), 1), MAX_PAGE_SIZE);
  const page = Math.max(Math.trunc(request.page ?? 1), 1);
  return { page, pageSize };
}

export function toPage<T>(rows: T[], total: number, request: PageRequest): Page<T> {
  return { rows, total, page: request.page, pageSize: request.pageSize, pageCount: Math.max(1, Math.ceil(total / request.pageSize)) };
}
