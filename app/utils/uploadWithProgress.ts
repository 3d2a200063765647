/**
 * Uploads one file as multipart form data with upload progress (fetch has no
 * upload progress; XMLHttpRequest does). Resolves with the JSON body or rejects
 * with an error carrying the server's JSON, like $fetch's errors.
 */
export function uploadWithProgress<T>(url: string, file: File, fields: Record<string, string> = {}, onProgress?: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', url)
    xhr.responseType = 'json'
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.(e.loaded / e.total)
    }
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) resolve(xhr.response as T)
      else reject(Object.assign(new Error((xhr.response as { message?: string } | null)?.message ?? `Upload failed (${xhr.status})`), { data: xhr.response, statusCode: xhr.status }))
    }
    xhr.onerror = () => reject(new Error('The upload did not reach the server.'))
    const form = new FormData()
    form.append('file', file)
    for (const [k, v] of Object.entries(fields)) form.append(k, v)
    xhr.send(form)
  })
}
