/** Shapes shared by the API and the client. Lists: `{ data, meta }`; errors: `{ code, message, details }`. */
export interface ListResponse<T, M = { total: number; page?: number; pageSize?: number }> {
  data: T[];
  meta: M;
}

export interface ApiErrorBody {
  code: string;
  message: string;
  details?: Array<{ path?: string; message: string; file?: string; row?: number; column?: number }>;
}
