/**
 * What goes round one JPEG sent as the field "files" of a multipart upload, built by hand so that
 * the benchmarks' clients spend next to no CPU of the machine they measure.
 */
export function oneFileEnvelope(filename: string): {
  contentType: string;
  head: Buffer;
  tail: Buffer;
} {
  const boundary = `----emberline${Math.random().toString(16).slice(2)}`;
  return {
    contentType: `multipart/form-data; boundary=${boundary}`,
    head: Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${filename}"\r\nContent-Type: image/jpeg\r\n\r\n`,
    ),
    tail: Buffer.from(`\r\n--${boundary}--\r\n`),
  };
}
