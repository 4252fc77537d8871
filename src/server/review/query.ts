// The queue's filters as they travel in a URL (the page's GET form, its sort and page links, the exports, the
// JSON API), read into a ReviewQuery. A value that is not one the queue knows is dropped, never passed on: the
// statement binds only known flags, sort keys and plain strings.
import {
  REVIEW_FLAGS,
  REVIEW_SORTS,
  type ReviewFlag,
  type ReviewQuery,
  type ReviewSort,
} from '../storage/types.js';

export const PAGE_SIZE = 50;
export const MAX_PAGE_SIZE = 200;

const DATE = /^\d{4}-\d{2}-\d{2}$/;

const text = (params: URLSearchParams, name: string): string | null => {
  const value = params.get(name)?.trim() ?? '';
  return value === '' ? null : value.slice(0, 200);
};

export function parseReviewQuery(params: URLSearchParams): ReviewQuery {
  const flags = params
    .getAll('flag')
    .filter((f): f is ReviewFlag => (REVIEW_FLAGS as readonly string[]).includes(f));
  const sortParam = params.get('sort') ?? '';
  const sort: ReviewSort = (REVIEW_SORTS as readonly string[]).includes(sortParam)
    ? (sortParam as ReviewSort)
    : 'level';
  const size = Math.min(MAX_PAGE_SIZE, Math.max(1, Number(params.get('size')) || PAGE_SIZE));
  const page = Math.max(1, Math.floor(Number(params.get('page')) || 1));
  const date = (name: string) => {
    const v = params.get(name) ?? '';
    return DATE.test(v) ? v : null;
  };
  return {
    flags: [...new Set(flags)],
    welder: text(params, 'welder'),
    procedure: text(params, 'procedure'),
    drawing: text(params, 'drawing'),
    area: text(params, 'area'),
    deviceKid: text(params, 'device'),
    inspector: text(params, 'inspector'),
    from: date('from'),
    to: date('to'),
    text: text(params, 'q'),
    sort,
    // Worst level first by default: ascending level rank puts "below D" on top.
    descending: params.get('dir') === 'desc',
    offset: (page - 1) * size,
    limit: size,
  };
}

/** The URL parameters of a query (for links that keep the filters: sort, pages, exports, the report). */
export function queryParams(q: ReviewQuery, over: Partial<ReviewQuery> = {}): URLSearchParams {
  const v = { ...q, ...over };
  const out = new URLSearchParams();
  for (const f of v.flags) out.append('flag', f);
  const put = (name: string, value: string | null) => {
    if (value !== null) out.set(name, value);
  };
  put('welder', v.welder);
  put('procedure', v.procedure);
  put('drawing', v.drawing);
  put('area', v.area);
  put('device', v.deviceKid);
  put('inspector', v.inspector);
  put('from', v.from);
  put('to', v.to);
  put('q', v.text);
  out.set('sort', v.sort);
  if (v.descending) out.set('dir', 'desc');
  if (v.limit !== PAGE_SIZE) out.set('size', String(v.limit));
  const page = Math.floor(v.offset / v.limit) + 1;
  if (page > 1) out.set('page', String(page));
  return out;
}
