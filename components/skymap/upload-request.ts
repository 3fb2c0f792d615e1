/** What an upload answered: the parsed JSON body (an error body on 4xx/5xx) and the status. */
export interface UploadOutcome<T> {
  status: number;
  body: T | { error: string };
}

/**
 * POSTs files as multipart/form-data with XMLHttpRequest, because fetch cannot report upload progress.
 * `onProgress` receives 0–1 as the bytes leave the browser.
 */
export function uploadWithProgress<T>(
  url: string,
  files: ReadonlyArray<{ field: string; file: File }>,
  onProgress: (fraction: number) => void,
  /** text fields, sent before the files */
  fields: Readonly<Record<string, string>> = {},
): { done: Promise<UploadOutcome<T>>; abort: () => void } {
  const xhr = new XMLHttpRequest();
  const form = new FormData();
  for (const [name, value] of Object.entries(fields)) form.append(name, value);
  for (const { field, file } of files) form.append(field, file, file.name);
  const done = new Promise<UploadOutcome<T>>((resolve) => {
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: T | { error: string };
      try {
        body = JSON.parse(xhr.responseText) as T | { error: string };
      } catch {
        body = { error: `the server answered ${xhr.status} ${xhr.statusText}` };
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => resolve({ status: 0, body: { error: "the upload failed: network error" } });
    xhr.onabort = () => resolve({ status: 0, body: { error: "the upload was cancelled" } });
  });
  xhr.open("POST", url);
  xhr.send(form);
  return { done, abort: () => xhr.abort() };
}
