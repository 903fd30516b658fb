// The browser's PUT straight to storage. XMLHttpRequest rather than fetch because only it reports
// upload progress.

export class SendError extends Error {
  constructor(
    message: string,
    /** The signed URL was refused (expired, most likely): a fresh upload is needed. */
    readonly urlRefused = false,
  ) {
    super(message);
    this.name = 'SendError';
  }
}

export interface Sending {
  done: Promise<void>;
  abort(): void;
}

export function sendFile(url: string, file: Blob, headers: Record<string, string>, onProgress: (fraction: number) => void): Sending {
  const xhr = new XMLHttpRequest();
  const done = new Promise<void>((resolve, reject) => {
    xhr.open('PUT', url);
    for (const [name, value] of Object.entries(headers)) xhr.setRequestHeader(name, value);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(1);
        resolve();
      } else if (xhr.status === 403) {
        reject(new SendError('The upload link was refused or has expired. Retry to get a fresh one.', true));
      } else {
        reject(new SendError(`The photo store answered ${xhr.status}. Retry in a moment.`));
      }
    };
    xhr.onerror = () => reject(new SendError('The upload was interrupted. Check your connection and retry.'));
    xhr.onabort = () => reject(new SendError('Upload cancelled.'));
    xhr.send(file);
  });
  return { done, abort: () => xhr.abort() };
}
