import { useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useUploadQueue } from '../../../lib/use-upload-queue';
import { inspectionKeys } from '../../../lib/inspection-keys';
import { imageUploadUrl } from '../api/inspections';

const unplayable =
  'This video cannot be played in the browser (HEVC, AVI and MOV files are not). Convert it to MP4 with H.264 video, or to WebM, and open it again.';

/**
 * Frames from a probe video, grabbed in the browser: the video never goes to the server; each
 * grabbed frame uploads as a PNG that remembers the video's file name and time.
 */
export function VideoFrames({ inspectionId }: { inspectionId: string }) {
  const { queue } = useUploadQueue();
  const queryClient = useQueryClient();
  const video = useRef<HTMLVideoElement>(null);
  const [source, setSource] = useState<{ url: string; name: string } | null>(null);
  const [error, setError] = useState('');
  const [grabbed, setGrabbed] = useState(0);

  useEffect(() => () => (source ? URL.revokeObjectURL(source.url) : undefined), [source]);

  const open = (file: File | undefined) => {
    setError('');
    setGrabbed(0);
    if (!file) return;
    const probe = document.createElement('video');
    if (file.type && probe.canPlayType(file.type) === '') {
      setSource(null);
      setError(unplayable);
      return;
    }
    setSource({ url: URL.createObjectURL(file), name: file.name });
  };

  const grab = () => {
    const element = video.current;
    if (!element || !source || element.videoWidth === 0) return;
    const canvas = document.createElement('canvas');
    canvas.width = element.videoWidth;
    canvas.height = element.videoHeight;
    canvas.getContext('2d')!.drawImage(element, 0, 0);
    const time = element.currentTime;
    canvas.toBlob((blob) => {
      if (!blob) return;
      const stem = source.name.replace(/\.[^.]+$/, '');
      queue.enqueue(
        imageUploadUrl(inspectionId),
        [
          {
            file: blob,
            name: `${stem}-${time.toFixed(2)}s.png`,
            fields: { videoFileName: source.name, videoTimeSeconds: time.toFixed(3) },
          },
        ],
        () => void queryClient.invalidateQueries({ queryKey: inspectionKeys.detail(inspectionId) }),
      );
      setGrabbed((count) => count + 1);
    }, 'image/png');
  };

  return (
    <div className="flex flex-col gap-3">
      <label className="flex flex-col gap-1 text-sm font-medium">
        Probe video (MP4 or WebM)
        <input
          type="file"
          accept="video/mp4,video/webm,video/*"
          onChange={(event) => open(event.target.files?.[0])}
          className="text-sm"
        />
      </label>
      {error ? <Notice tone="error">{error}</Notice> : null}
      {source ? (
        <>
          <video
            ref={video}
            src={source.url}
            controls
            preload="auto"
            className="max-h-[50vh] w-full rounded bg-black"
            onError={() => setError(unplayable)}
            aria-label={`Video ${source.name}`}
          />
          <div className="flex items-center gap-3">
            <Button onClick={grab}>Grab this frame</Button>
            {grabbed > 0 ? (
              <span className="text-sm text-soot-700" role="status">
                {grabbed} frame{grabbed === 1 ? '' : 's'} sent to the upload queue
              </span>
            ) : null}
          </div>
        </>
      ) : null}
    </div>
  );
}
