/**
 * Sends a multipart form with upload progress (fetch cannot report it yet). Resolves with the JSON answer;
 * rejects in the shape `apiErrorMessage` reads, so the server's own sentence reaches the person.
 */
export function postMultipart<T>(url: string, body: FormData, onProgress?: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', url)
    xhr.responseType = 'json'
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && onProgress) onProgress(e.loaded / e.total)
    }
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) resolve(xhr.response as T)
      else reject({ statusCode: xhr.status, data: xhr.response ?? { message: `The server answered ${xhr.status}.` } })
    }
    xhr.onerror = () => reject({ data: { message: 'The upload was interrupted. Check the connection and send again.' } })
    xhr.send(body)
  })
}
