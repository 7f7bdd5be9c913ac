"use client";

import type { IScannerControls } from "@zxing/browser";
import { useTranslations } from "next-intl";
import { useCallback, useEffect, useRef, useState } from "react";

type CameraError = "denied" | "noCamera" | "busy" | "insecure" | "unknown";

/** getUserMedia's DOMException names (Media Capture and Streams, §10.1), in words a brewer can act on. */
function cameraError(error: unknown): CameraError {
  const name = error instanceof Error || error instanceof DOMException ? error.name : "";
  if (name === "NotAllowedError" || name === "SecurityError" || name === "PermissionDeniedError") return "denied";
  if (name === "NotFoundError" || name === "OverconstrainedError" || name === "DevicesNotFoundError") return "noCamera";
  if (name === "NotReadableError" || name === "TrackStartError" || name === "AbortError") return "busy";
  return "unknown";
}

/**
 * The rear camera, read continuously for QR codes. `onText` gets every code read and says
 * whether it was the one wanted (then the camera stops, saving the battery and the next
 * bag from being read by accident).
 */
export function Scanner({ onText, autoStart = false }: { onText: (text: string) => boolean; autoStart?: boolean }) {
  const t = useTranslations("floorScan.camera");
  const video = useRef<HTMLVideoElement>(null);
  const controls = useRef<IScannerControls | null>(null);
  const onTextRef = useRef(onText);
  const [state, setState] = useState<"off" | "starting" | "on">("off");
  const [error, setError] = useState<CameraError | null>(null);

  useEffect(() => {
    onTextRef.current = onText;
  }, [onText]);
  useEffect(() => () => controls.current?.stop(), []);

  const stop = () => {
    controls.current?.stop();
    controls.current = null;
    setState("off");
  };

  const start = useCallback(async () => {
    setError(null);
    if (!navigator.mediaDevices?.getUserMedia) {
      setError(window.isSecureContext ? "noCamera" : "insecure");
      return;
    }
    setState("starting");
    let done = false;
    try {
      const { BrowserQRCodeReader } = await import("@zxing/browser");
      const reader = new BrowserQRCodeReader(undefined, { delayBetweenScanAttempts: 150, delayBetweenScanSuccess: 600 });
      const running = await reader.decodeFromConstraints({ audio: false, video: { facingMode: "environment" } }, video.current!, (result, _error, own) => {
        if (done || !result || !onTextRef.current(result.getText())) return;
        done = true;
        own.stop();
        controls.current = null;
        setState("off");
      });
      if (done || !video.current) running.stop();
      else {
        controls.current = running;
        setState("on");
      }
    } catch (failure) {
      setState("off");
      setError(cameraError(failure));
    }
  }, []);

  // A scan button beside a field has already said "open the camera": no second tap.
  useEffect(() => {
    if (autoStart) void start();
  }, [autoStart, start]);

  return (
    <section className="space-y-3" data-testid="scanner">
      <div className={`relative aspect-[4/3] overflow-hidden rounded-xl border-4 ${state === "on" ? "border-koji" : "border-paper/30"} bg-black`}>
        <video ref={video} aria-label={t("preview")} muted playsInline className={`h-full w-full object-cover ${state === "on" ? "" : "invisible"}`} />
        {state !== "on" ? <p className="absolute inset-0 flex items-center justify-center p-4 text-center opacity-80">{state === "starting" ? t("starting") : t("hint")}</p> : null}
      </div>
      <button type="button" onClick={state === "off" ? start : stop} disabled={state === "starting"} className={`${state === "on" ? "btn-quiet" : "btn"} min-h-14 w-full text-xl`}>
        {state === "on" ? t("stop") : t("start")}
      </button>
      {error ? (
        <p role="alert" className="notice-warn text-ink" data-testid="camera-error">
          {t(`errors.${error}`)}
        </p>
      ) : null}
    </section>
  );
}
