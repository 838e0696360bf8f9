import {
  Button,
  Field,
  Input,
  MessageBar,
  MessageBarBody,
  Text,
  makeStyles,
  tokens,
} from '@fluentui/react-components';
import { useEffect, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { createFrameDecoder, type FrameDecoder } from './frame-decoder';
import { publicPath, readScan, type ScanTarget } from './scan-target';
import { lookupScannedLot } from './scanner.api';
import { ScanScreen } from './ScanScreen';

const useStyles = makeStyles({
  video: {
    width: '100%',
    maxHeight: '60vh',
    backgroundColor: tokens.colorNeutralBackground3,
    borderRadius: tokens.borderRadiusMedium,
    objectFit: 'cover',
  },
  row: { display: 'flex', gap: tokens.spacingHorizontalM, flexWrap: 'wrap', alignItems: 'end' },
});

const FRAME_INTERVAL_MS = 150;

/** Opens the public page of a lot (a separate page of the site, so a full navigation). */
function openPublic(target: ScanTarget): void {
  window.location.assign(publicPath(target));
}

/**
 * The fair scanner: reads a tag with the camera (or a typed code) and opens the lot when the
 * dealer holds it, otherwise its public page, where the tag is checked against the roll.
 */
export function ScannerPage() {
  const styles = useStyles();
  const navigate = useNavigate();
  const videoRef = useRef<HTMLVideoElement>(null);
  const streamRef = useRef<MediaStream | null>(null);
  const decoderRef = useRef<FrameDecoder | null>(null);
  const [scanning, setScanning] = useState(false);
  const [engine, setEngine] = useState<FrameDecoder['engine'] | null>(null);
  const [cameraError, setCameraError] = useState<string | null>(null);
  const [typed, setTyped] = useState('');
  const [typedError, setTypedError] = useState<string | undefined>();
  const [opening, setOpening] = useState<string | null>(null);

  const stopCamera = () => {
    streamRef.current?.getTracks().forEach((t) => t.stop());
    streamRef.current = null;
    setScanning(false);
  };
  useEffect(() => stopCamera, []);

  const open = async (target: ScanTarget) => {
    setOpening(target.code);
    const lot = await lookupScannedLot(target.code);
    if (lot.held || lot.offline)
      navigate(`/scan/lots/${target.code}${target.ref ? `?ref=${target.ref}` : ''}`);
    else openPublic(target);
  };

  const startCamera = async () => {
    setCameraError(null);
    if (!window.isSecureContext || !navigator.mediaDevices?.getUserMedia) {
      setCameraError(
        'The camera works only on a secure page (https, or this device itself). Type the code from the tag instead.',
      );
      return;
    }
    let stream: MediaStream;
    try {
      stream = await navigator.mediaDevices.getUserMedia({
        video: { facingMode: { ideal: 'environment' } },
        audio: false,
      });
    } catch (e) {
      setCameraError(
        (e as Error).name === 'NotAllowedError'
          ? 'The browser did not allow the camera. Allow it in the site settings, or type the code.'
          : 'No camera could be opened. Type the code from the tag instead.',
      );
      return;
    }
    streamRef.current = stream;
    const video = videoRef.current!;
    video.srcObject = stream;
    await video.play().catch(() => undefined);
    const decoder = await createFrameDecoder();
    decoderRef.current = decoder;
    setEngine(decoder.engine);
    setScanning(true);
  };

  useEffect(() => {
    if (!scanning) return;
    let stopped = false;
    let timer: ReturnType<typeof setTimeout>;
    const tick = async () => {
      const decoder = decoderRef.current;
      if (stopped || !videoRef.current || !decoder) return;
      const text = await decoder.decode(videoRef.current).catch(() => null);
      const target = text ? readScan(text) : null;
      if (target && !stopped) {
        stopped = true;
        stopCamera();
        await open(target);
        return;
      }
      timer = setTimeout(tick, FRAME_INTERVAL_MS);
    };
    timer = setTimeout(tick, FRAME_INTERVAL_MS);
    return () => {
      stopped = true;
      clearTimeout(timer);
    };
    // `open` and `stopCamera` only read refs and setters, so one scanning session may keep them.
  }, [scanning]);

  return (
    <ScanScreen title="Scan a tag" titleId="scan-title">
      <Text>
        Hold a Beadroll tag in front of the camera. Your own lots open with their quick actions; any other lot
        opens its public history, checked against the tag.
      </Text>
      {/* The stream is muted and has no audio track, so there is nothing to caption. */}
      <video
        ref={videoRef}
        className={styles.video}
        muted
        playsInline
        aria-label="Camera view"
        hidden={!scanning}
      />
      <div className={styles.row}>
        {scanning ? (
          <Button onClick={stopCamera}>Stop camera</Button>
        ) : (
          <Button appearance="primary" onClick={() => void startCamera()}>
            Start camera
          </Button>
        )}
        {scanning && (
          <Text aria-live="polite">Looking for a tag{engine === 'jsqr' ? '' : ' (built-in reader)'}…</Text>
        )}
      </div>
      {cameraError && (
        <MessageBar intent="warning">
          <MessageBarBody>{cameraError}</MessageBarBody>
        </MessageBar>
      )}
      {opening && <Text aria-live="polite">Opening {opening}…</Text>}
      <form
        className={styles.row}
        onSubmit={(e) => {
          e.preventDefault();
          const target = readScan(typed);
          if (!target) {
            setTypedError('Not a lot code: 9 symbols such as 7K2Q-M9XA-T (the last one is a check).');
            return;
          }
          setTypedError(undefined);
          void open(target);
        }}
      >
        <Field label="Lot code from the tag" validationMessage={typedError}>
          <Input
            value={typed}
            onChange={(_, d) => setTyped(d.value)}
            placeholder="7K2Q-M9XA-T"
            autoComplete="off"
          />
        </Field>
        <Button type="submit">Open</Button>
      </form>
    </ScanScreen>
  );
}
