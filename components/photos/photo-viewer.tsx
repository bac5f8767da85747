'use client';

import { useEffect, useRef, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';

export interface ViewerPhoto {
  id: string;
  fullUrl: string;
  alt: string;
  details: ReactNode;
}

interface PhotoViewerProps {
  photo: ViewerPhoto | null;
  onClose: () => void;
  onPrevious?: () => void;
  onNext?: () => void;
}

/** The full-size photo in a modal dialog with its finding; Escape closes, the arrow keys step through. */
export function PhotoViewer({ photo, onClose, onPrevious, onNext }: PhotoViewerProps) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (photo && !dialog.open) dialog.showModal();
    if (!photo && dialog.open) dialog.close();
  }, [photo]);

  return (
    <dialog
      ref={ref}
      aria-label={photo ? photo.alt : 'Photo'}
      className="m-auto max-h-[100dvh] w-full max-w-5xl bg-transparent p-0 backdrop:bg-black/80"
      onClose={onClose}
      onKeyDown={(e) => {
        if (e.key === 'ArrowLeft' && onPrevious) onPrevious();
        if (e.key === 'ArrowRight' && onNext) onNext();
      }}
    >
      {photo && (
        <div className="flex max-h-[100dvh] flex-col overflow-y-auto bg-panel lg:flex-row">
          <div className="flex items-center justify-center bg-black lg:flex-1">
            {/* The redirect route hands out a short-lived signed link; the browser follows it. */}
            <img key={photo.id} src={photo.fullUrl} alt={photo.alt} className="max-h-[70dvh] w-auto max-w-full object-contain lg:max-h-[90dvh]" />
          </div>
          <div className="flex flex-col gap-3 p-4 lg:w-80">
            {photo.details}
            <div className="mt-auto flex flex-wrap gap-2">
              {onPrevious && (
                <Button type="button" variant="secondary" onClick={onPrevious} aria-label="Previous photo">
                  ← Previous
                </Button>
              )}
              {onNext && (
                <Button type="button" variant="secondary" onClick={onNext} aria-label="Next photo">
                  Next →
                </Button>
              )}
              <Button type="button" onClick={() => ref.current?.close()} autoFocus>
                Close
              </Button>
            </div>
          </div>
        </div>
      )}
    </dialog>
  );
}
