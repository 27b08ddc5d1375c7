// Tracing over a drawing: an uploaded image put behind the elevation view and scaled from two clicked points.
import { useState } from "react";
import type { Backdrop } from "~/components/plan-canvas.client";
import type { EditorFile } from "~/components/plan-editor";
import { Button } from "~/components/ui/form";
import type { ComponentDefinition } from "~/loads/component-definition";
import { calibrateImageScale } from "~/plans/editor-state";
import { fromDisplayLength, lengthUnitLabel, type Units } from "~/utils/format";

type Calibration = {
  fileId: number;
  image: HTMLImageElement;
  clicks: Array<{ x: number; y: number; a: number; b: number }>;
};

export type Tracing = ReturnType<typeof useTracing>;

/** The backdrop and its scale-setting state; the first guess fits the image to the load's length. */
export function useTracing(snapshot: ComponentDefinition, units: Units) {
  const [backdrop, setBackdrop] = useState<Backdrop | null>(null);
  const [calibration, setCalibration] = useState<Calibration | null>(null);
  const [calibrationDistance, setCalibrationDistance] = useState("");

  function startCalibration(fileId: number) {
    const image = new window.Image();
    image.onload = () => {
      setCalibration({ fileId, image, clicks: [] });
      setBackdrop({
        image,
        metresPerPixel: snapshot.lengthM / image.width,
        originA: -snapshot.lengthM / 2,
        originB: snapshot.heightM,
        opacity: 0.5,
      });
    };
    image.src = `/files/${fileId}`;
  }

  function pickForCalibration(point: { a: number; b: number; x: number; y: number }) {
    setCalibration((c) => (c ? { ...c, clicks: [...c.clicks.slice(-1), point] } : c));
  }

  function applyCalibration() {
    if (!calibration || !backdrop || calibration.clicks.length < 2) return;
    const [p1, p2] = calibration.clicks;
    if (!p1 || !p2) return;
    // The clicks are in world metres at the drawing's current scale; convert back to image pixels.
    const toPixel = (p: { a: number; b: number }) => ({
      x: (p.a - backdrop.originA) / backdrop.metresPerPixel,
      y: (backdrop.originB - p.b) / backdrop.metresPerPixel,
    });
    const distanceM = fromDisplayLength(Number(calibrationDistance), units);
    const metresPerPixel = calibrateImageScale(toPixel(p1), toPixel(p2), distanceM);
    if (metresPerPixel === null) return;
    setBackdrop({ ...backdrop, metresPerPixel });
    setCalibration(null);
    setCalibrationDistance("");
  }

  return {
    backdrop,
    setBackdrop,
    calibration,
    calibrationDistance,
    setCalibrationDistance,
    startCalibration,
    pickForCalibration,
    applyCalibration,
  };
}

export function TracingPanel({ files, units, tracing }: { files: EditorFile[]; units: Units; tracing: Tracing }) {
  const lu = lengthUnitLabel(units);
  const {
    backdrop,
    setBackdrop,
    calibration,
    calibrationDistance,
    setCalibrationDistance,
    startCalibration,
    applyCalibration,
  } = tracing;
  if (files.length === 0) return null;
  return (
    <div className="border-t border-rule pt-3 text-sm">
      <p className="font-semibold">Trace over a drawing (elevation view)</p>
      <div className="mt-1 flex flex-wrap items-center gap-2">
        {files.map((f) => (
          <Button key={f.fileId} type="button" tone="secondary" onClick={() => startCalibration(f.fileId)}>
            Put {f.caption || f.name} behind
          </Button>
        ))}
        {backdrop && (
          <Button type="button" tone="secondary" onClick={() => setBackdrop(null)}>
            Remove the drawing
          </Button>
        )}
      </div>
      {calibration && (
        <div className="mt-2 space-y-2 rounded border border-steel/30 bg-steel-soft p-2">
          <p>
            Set its scale: click two points on the drawing whose distance you know ({calibration.clicks.length} of 2
            clicked), then type the distance.
          </p>
          <label className="block">
            Distance between them ({lu})
            <input
              className="ml-2 w-28 rounded border border-rule px-2 py-1"
              inputMode="decimal"
              value={calibrationDistance}
              onChange={(e) => setCalibrationDistance(e.target.value)}
            />
          </label>
          <Button
            type="button"
            onClick={applyCalibration}
            disabled={calibration.clicks.length < 2 || !(Number(calibrationDistance) > 0)}
          >
            Set the scale
          </Button>
        </div>
      )}
    </div>
  );
}
