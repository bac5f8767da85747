/** The desk's calls to /api/blocks: JSON in and out, errors as ApiError with the server's fields. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

function errorFrom(status: number, data: unknown) {
  const error = (data as { error?: { code?: string; message?: string; fields?: Record<string, string[]> } } | null)?.error;
  return new ApiError(status, error?.code ?? 'internal', error?.message ?? `The server answered ${status}; try again.`, error?.fields);
}

export async function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method: init.method ?? 'GET',
      headers: init.body === undefined ? undefined : { 'content-type': 'application/json' },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
    });
  } catch {
    throw new ApiError(0, 'offline', 'No connection to Vineward. Nothing was changed; try again when you are back online.');
  }
  const data = await res.json().catch(() => null);
  if (!res.ok) throw errorFrom(res.status, data);
  return data as T;
}

/**
 * Sends a file as the request body and reports upload progress (0–1), which fetch cannot do.
 * Resolves with the JSON answer; rejects with ApiError like `api`.
 */
export function uploadFile<T>(path: string, file: Blob, onProgress: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.setRequestHeader('content-type', 'text/csv');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let data: unknown = null;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        // Answered with something other than JSON: reported below by status.
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(data as T);
      else reject(errorFrom(xhr.status, data));
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'The upload did not reach Vineward. Nothing was changed; try again.'));
    xhr.send(file);
  });
}
