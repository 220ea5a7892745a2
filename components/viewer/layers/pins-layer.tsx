"use client";
// Pins of the live review drawn at their anchors: a ball on a short stem above the member midpoint, node, clash
// or point. State reads without colour too: open pins are full-size balls, answered ones smaller, closed ones
// small and faint. Clicking a pin opens its thread. Stems, solid balls and faint balls are one instanced mesh each
// (instanced-bodies.tsx), so pins cost three draw calls however many there are.
import { Html } from "@react-three/drei";
import { useMemo } from "react";
import { CylinderGeometry, Quaternion, SphereGeometry, Vector3 } from "three";
import type { PinState, Vec3 } from "@/lib/realtime/events";
import { InstancedBodies, type Body } from "./instanced-bodies";

export const pinLook = {
  colour: { open: "#4338ca", answered: "#a16207", closed: "#64748b" },
  selected: "#7c3aed",
  /** Ball radius (m) per state and the stem height (m) above the anchor. */
  radius: { open: 0.22, answered: 0.17, closed: 0.12 },
  closedOpacity: 0.55,
  stem: 0.6,
} as const;

export interface PinMarker {
  id: string;
  title: string;
  state: PinState;
  position: Vec3;
}

const ball = new SphereGeometry(1, 16, 12);
const stem = new CylinderGeometry(0.02, 0.02, 1, 6);
const upright = new Quaternion().setFromAxisAngle(new Vector3(1, 0, 0), Math.PI / 2);

function pinLookOf(pin: PinMarker, selectedPinId: string | null) {
  const selected = pin.id === selectedPinId;
  return { selected, colour: selected ? pinLook.selected : pinLook.colour[pin.state], radius: pinLook.radius[pin.state] * (selected ? 1.3 : 1) };
}

const solidBall = {};
const faintBall = { transparent: true, opacity: pinLook.closedOpacity };
const stemMaterial = {};

export function PinsLayer({ pins, selectedPinId, onSelectPin }: { pins: PinMarker[]; selectedPinId: string | null; onSelectPin: (id: string) => void }) {
  const selectedPin = pins.find((pin) => pin.id === selectedPinId);
  const { stems, solid, faint, solidPins, faintPins } = useMemo(() => {
    const ballOf = (pin: PinMarker): Body => {
      const { colour, radius } = pinLookOf(pin, selectedPinId);
      const [x, y, z] = pin.position;
      return { position: [x, y, z + pinLook.stem], scale: radius, colour };
    };
    const solidPins = pins.filter((pin) => pin.state !== "closed");
    const faintPins = pins.filter((pin) => pin.state === "closed");
    return {
      // The stem geometry is along y: scale it to the stem height and turn it upright (z).
      stems: pins.map((pin): Body => ({ position: [pin.position[0], pin.position[1], pin.position[2] + pinLook.stem / 2], quaternion: upright, scale: [1, pinLook.stem, 1], colour: pinLookOf(pin, selectedPinId).colour })),
      solid: solidPins.map(ballOf),
      faint: faintPins.map(ballOf),
      solidPins,
      faintPins,
    };
  }, [pins, selectedPinId]);
  return (
    <group name="review-pins">
      <InstancedBodies name="pin-stems" geometry={stem} material={stemMaterial} bodies={stems} />
      <InstancedBodies name="pins" geometry={ball} material={solidBall} bodies={solid} onPick={(k) => onSelectPin(solidPins[k].id)} />
      <InstancedBodies name="pins-closed" geometry={ball} material={faintBall} bodies={faint} onPick={(k) => onSelectPin(faintPins[k].id)} />
      {selectedPin ? (
        <Html position={[selectedPin.position[0], selectedPin.position[1], selectedPin.position[2] + pinLook.stem + pinLookOf(selectedPin, selectedPinId).radius * 2]} center zIndexRange={[20, 0]}>
          <div className="pointer-events-none whitespace-nowrap rounded bg-white/95 px-2 py-0.5 text-xs shadow" data-testid="pin-label">
            {selectedPin.title}
          </div>
        </Html>
      ) : null}
    </group>
  );
}
