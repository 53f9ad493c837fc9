import { useEffect, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Dialog } from '#src/components/ui/dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { paths } from '#src/config/paths';
import { findPacketLot } from '../api/find-packet-lot';
import { lotPathFromCode, packetTokenFromCode } from '../lot-link';

/** The camera's live picture on the page (the DOM's media element for moving pictures). */
type CameraPreview = HTMLElementTagNameMap['video'];
/** Reads a QR code's text from the camera's current picture, or null when it holds none. */
type ReadFrame = (preview: CameraPreview) => Promise<string | null>;

interface DetectedBarcode {
  rawValue: string;
}
interface BarcodeDetectorLike {
  detect(image: CameraPreview): Promise<DetectedBarcode[]>;
}
interface BarcodeDetectorClass {
  new (options: { formats: string[] }): BarcodeDetectorLike;
  getSupportedFormats(): Promise<string[]>;
}

/**
 * The browser's own BarcodeDetector where it reads QR codes (Android, ChromeOS, macOS); elsewhere
 * the jsQR decoder, fetched only now that someone is scanning.
 */
async function frameReader(): Promise<ReadFrame> {
  const Detector = (window as unknown as { BarcodeDetector?: BarcodeDetectorClass }).BarcodeDetector;
  const formats: string[] = Detector ? await Detector.getSupportedFormats().catch(() => []) : [];
  if (Detector && formats.includes('qr_code')) {
    const detector = new Detector({ formats: ['qr_code'] });
    return async (preview) => (await detector.detect(preview))[0]?.rawValue ?? null;
  }
  const { default: jsQR } = await import('jsqr');
  const canvas = document.createElement('canvas');
  const context = canvas.getContext('2d', { willReadFrequently: true });
  return async (preview) => {
    if (!context || preview.readyState < HTMLMediaElement.HAVE_CURRENT_DATA) return null;
    // The camera's current frame at its own size.
    const frame = await createImageBitmap(preview);
    canvas.width = frame.width;
    canvas.height = frame.height;
    context.drawImage(frame, 0, 0);
    frame.close();
    const image = context.getImageData(0, 0, canvas.width, canvas.height);
    return jsQR(image.data, image.width, image.height)?.data ?? null;
  };
}

/** Why the camera would not start, in words a grower can act on. */
function cameraProblem(error: unknown): string {
  const name = error instanceof DOMException || error instanceof Error ? error.name : '';
  switch (name) {
    case 'NotAllowedError':
    case 'SecurityError':
      return 'Hilum may not use the camera. Allow the camera for this site in the browser’s settings and try again — or find the lot by its code in the Lots list.';
    case 'NotFoundError':
    case 'OverconstrainedError':
      return 'This device has no camera Hilum can use. Find the lot by its code in the Lots list instead.';
    case 'NotReadableError':
    case 'AbortError':
      return 'The camera is busy (another app may be using it). Close that app and try again.';
    default:
      return 'The camera could not be started here. Find the lot by its code in the Lots list instead.';
  }
}

const READ_EVERY_MS = 250;

export interface ScanDialogProps {
  open: boolean;
  onClose: () => void;
}

/**
 * Scan a packet: the back camera's picture, read a few times a second until it shows a Hilum packet
 * label's QR code, which opens that lot's page. Says in words when there is no camera, the camera
 * is refused, or the code is not one of ours.
 */
export function ScanDialog({ open, onClose }: ScanDialogProps) {
  return (
    <Dialog open={open} title="Scan a packet label" onClose={onClose}>
      <Scanner onClose={onClose} />
    </Dialog>
  );
}

function Scanner({ onClose }: { onClose: () => void }) {
  const navigate = useNavigate();
  const previewRef = useRef<CameraPreview>(null);
  // The camera starts once per opening, whatever the page around it redraws.
  const closeRef = useRef(onClose);
  useEffect(() => {
    closeRef.current = onClose;
  });
  const [problem, setProblem] = useState<string>();
  const [notOurs, setNotOurs] = useState(false);
  const [scanning, setScanning] = useState(false);

  useEffect(() => {
    let stopped = false;
    let stream: MediaStream | null = null;
    let timer: number | undefined;
    const start = async () => {
      if (!navigator.mediaDevices?.getUserMedia) {
        setProblem(
          'This browser cannot use a camera here (it needs a secure https address). Find the lot by its code in the Lots list instead.',
        );
        return;
      }
      try {
        stream = await navigator.mediaDevices.getUserMedia({
          video: { facingMode: { ideal: 'environment' } },
          audio: false,
        });
      } catch (error) {
        if (!stopped) setProblem(cameraProblem(error));
        return;
      }
      const preview = previewRef.current;
      if (stopped || !preview) return;
      preview.srcObject = stream;
      await preview.play().catch(() => undefined);
      const read = await frameReader();
      if (stopped) return;
      setScanning(true);
      const tick = async () => {
        if (stopped) return;
        const text = await read(preview).catch(() => null);
        if (stopped) return;
        if (text !== null) {
          const lot = lotPathFromCode(text);
          if (lot) {
            closeRef.current();
            void navigate(lot.path);
            return;
          }
          // A label whose QR code holds the lot's public packet page: a member opens the lot itself.
          const token = packetTokenFromCode(text);
          const found = token ? await findPacketLot(token).catch(() => null) : null;
          if (stopped) return;
          if (token) {
            closeRef.current();
            if (found) void navigate(paths.lot.getHref(found.bankId, found.lotId));
            else window.location.assign(`/p/${token}`);
            return;
          }
          setNotOurs(true);
        }
        timer = window.setTimeout(() => void tick(), READ_EVERY_MS);
      };
      void tick();
    };
    void start();
    return () => {
      stopped = true;
      window.clearTimeout(timer);
      for (const track of stream?.getTracks() ?? []) track.stop();
    };
  }, [navigate]);

  if (problem) return <FormAlert title="No camera">{problem}</FormAlert>;
  return (
    <div className="grid gap-3">
      <p className="text-loam-700">
        Hold the packet’s label so its square code fills the middle of the picture.
      </p>
      <video
        ref={previewRef}
        muted
        playsInline
        aria-label="Camera picture"
        className="aspect-[4/3] w-full rounded-lg bg-loam-950 object-cover"
      />
      <div aria-live="polite" className="empty:hidden">
        {notOurs ? (
          <FormAlert tone="info" title="Not a Hilum label">
            That code is not a Hilum packet label. Point the camera at the code on one of your packet labels.
          </FormAlert>
        ) : scanning ? (
          <p className="text-sm text-loam-600">Looking for a code…</p>
        ) : (
          <p className="text-sm text-loam-600">Starting the camera…</p>
        )}
      </div>
    </div>
  );
}
