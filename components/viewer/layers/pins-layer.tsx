"use client";
// Pins of the live review drawn at their anchors: a ball on a short stem above the member midpoint, node, clash
// or point. State reads without colour too: open pins are full-size balls, answered ones smaller, closed ones
// small and faint. Clicking a pin opens its thread. Stems, solid balls and faint balls are one instanced mesh each
// (drei's Instances), so pins cost three draw calls however many there are.
import { Html, Instance, Instances } from "@react-three/drei";
import { useThree, type ThreeEvent } from "@react-three/fiber";
import { useEffect } from "react";
import { CylinderGeometry, SphereGeometry } from "three";
import type { PinState, Vec3 } from "@/lib/realtime/events";

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

function pinLookOf(pin: PinMarker, selectedPinId: string | null) {
  const selected = pin.id === selectedPinId;
  return { selected, colour: selected ? pinLook.selected : pinLook.colour[pin.state], radius: pinLook.radius[pin.state] * (selected ? 1.3 : 1) };
}

function PinBalls({ pins, faint, selectedPinId, onSelectPin }: { pins: PinMarker[]; faint: boolean; selectedPinId: string | null; onSelectPin: (id: string) => void }) {
  return (
    <Instances limit={Math.max(1, pins.length)} geometry={ball}>
      <meshStandardMaterial transparent={faint} opacity={faint ? pinLook.closedOpacity : 1} />
      {pins.map((pin) => {
        const { colour, radius } = pinLookOf(pin, selectedPinId);
        const [x, y, z] = pin.position;
        return (
          <Instance
            key={pin.id}
            position={[x, y, z + pinLook.stem]}
            scale={radius}
            color={colour}
            onClick={(event: ThreeEvent<MouseEvent>) => {
              event.stopPropagation();
              onSelectPin(pin.id);
            }}
          />
        );
      })}
    </Instances>
  );
}

export function PinsLayer({ pins, selectedPinId, onSelectPin }: { pins: PinMarker[]; selectedPinId: string | null; onSelectPin: (id: string) => void }) {
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => invalidate(), [pins, selectedPinId, invalidate]);
  const selectedPin = pins.find((pin) => pin.id === selectedPinId);
  return (
    <group name="review-pins">
      <Instances limit={Math.max(1, pins.length)} geometry={stem}>
        <meshBasicMaterial />
        {pins.map((pin) => {
          const [x, y, z] = pin.position;
          return <Instance key={pin.id} position={[x, y, z + pinLook.stem / 2]} rotation={[Math.PI / 2, 0, 0]} scale={[1, pinLook.stem, 1]} color={pinLookOf(pin, selectedPinId).colour} />;
        })}
      </Instances>
      <PinBalls pins={pins.filter((pin) => pin.state !== "closed")} faint={false} selectedPinId={selectedPinId} onSelectPin={onSelectPin} />
      <PinBalls pins={pins.filter((pin) => pin.state === "closed")} faint selectedPinId={selectedPinId} onSelectPin={onSelectPin} />
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
