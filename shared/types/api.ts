/** Shapes shared by the API and the client. Lists: `{ data, meta }`; errors: `{ code, message, details }`. */
export interface ListResponse<T, M = { total: number; page?: number; pageSize?: number }> {
  data: T[];
  meta: M;
}

/**
 * One problem of a refused request: where (`path`: the field, parameter or JSON pointer such as
 * "/creators/0/name"; `file`, `row`, `column` for uploaded files) and what (`message`, a sentence for people).
 * A few errors add figures of their own beside these (a limit and a count, a rule's name).
 */
export interface ErrorDetail {
  path?: string;
  message: string;
  file?: string;
  row?: number;
  column?: number;
  [key: string]: unknown;
}

/** Every error the API answers: `{ code, message, details? }` (a withdrawn version adds its tombstone's fields). */
export interface ApiErrorBody {
  code: string;
  message: string;
  details?: ErrorDetail[];
}
