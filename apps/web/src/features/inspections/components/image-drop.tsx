import { useQueryClient } from '@tanstack/react-query';
import { useDropzone } from 'react-dropzone';
import { useUploadQueue } from '../../../lib/use-upload-queue';
import { inspectionKeys } from '../../../lib/inspection-keys';
import { imageUploadUrl } from '../api/inspections';

/** Drop borescope stills here; they go into the upload queue, which carries on across pages. */
export function ImageDrop({ inspectionId }: { inspectionId: string }) {
  const { queue } = useUploadQueue();
  const queryClient = useQueryClient();
  const refresh = () =>
    void queryClient.invalidateQueries({ queryKey: inspectionKeys.detail(inspectionId) });
  const dropzone = useDropzone({
    accept: {
      'image/jpeg': ['.jpg', '.jpeg'],
      'image/png': ['.png'],
      'image/tiff': ['.tif', '.tiff'],
      'image/webp': ['.webp'],
    },
    maxSize: 64 * 1024 * 1024,
    onDrop: (accepted) =>
      queue.enqueue(
        imageUploadUrl(inspectionId),
        accepted.map((file) => ({ file, name: file.name })),
        refresh,
      ),
  });
  return (
    <div
      {...dropzone.getRootProps({
        className: `cursor-pointer rounded-lg border-2 border-dashed px-4 py-8 text-center text-sm ${dropzone.isDragActive ? 'border-ember-500 bg-ember-50' : 'border-soot-300 bg-soot-50'}`,
      })}
    >
      <input {...dropzone.getInputProps({ 'aria-label': 'Images to upload' })} />
      <p className="font-medium">Drop borescope images here, or press to choose them</p>
      <p className="mt-1 text-xs text-soot-600">
        JPEG, PNG, TIFF or WebP, up to 64 MB each. Uploads go on while you work elsewhere.
      </p>
      {dropzone.fileRejections.length > 0 ? (
        <p role="alert" className="mt-2 text-red-800">
          {dropzone.fileRejections.length} file
          {dropzone.fileRejections.length === 1 ? ' is' : 's are'} not an image of those kinds, or
          over 64 MB, and stayed behind.
        </p>
      ) : null}
    </div>
  );
}
