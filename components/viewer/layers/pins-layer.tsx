"use client";
// Pins of the live review drawn at their anchors: a ball on a short stem above the member midpoint, node, clash
// or point. State reads without colour too: open pins are full-size balls, answered ones smaller, closed ones
// small and faint. Clicking a pin opens its thread.
import { Html } from "@react-three/drei";
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

export function PinsLayer({ pins, selectedPinId, onSelectPin }: { pins: PinMarker[]; selectedPinId: string | null; onSelectPin: (id: string) => void }) {
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => invalidate(), [pins, selectedPinId, invalidate]);
  return (
    <group name="review-pins">
      {pins.map((pin) => {
        const [x, y, z] = pin.position;
        const selected = pin.id === selectedPinId;
        const colour = selected ? pinLook.selected : pinLook.colour[pin.state];
        const radius = pinLook.radius[pin.state] * (selected ? 1.3 : 1);
        return (
          <group key={pin.id} position={[x, y, z]}>
            <mesh geometry={stem} position={[0, 0, pinLook.stem / 2]} rotation={[Math.PI / 2, 0, 0]} scale={[1, pinLook.stem, 1]}>
              <meshBasicMaterial color={colour} />
            </mesh>
            <mesh
              geometry={ball}
              position={[0, 0, pinLook.stem]}
              scale={radius}
              onClick={(event: ThreeEvent<MouseEvent>) => {
                event.stopPropagation();
                onSelectPin(pin.id);
              }}
            >
              <meshStandardMaterial color={colour} transparent={pin.state === "closed"} opacity={pin.state === "closed" ? pinLook.closedOpacity : 1} />
            </mesh>
            {selected ? (
              <Html position={[0, 0, pinLook.stem + radius * 2]} center zIndexRange={[20, 0]}>
                <div className="pointer-events-none whitespace-nowrap rounded bg-white/95 px-2 py-0.5 text-xs shadow" data-testid="pin-label">
                  {pin.title}
                </div>
              </Html>
            ) : null}
          </group>
        );
      })}
    </group>
  );
}
