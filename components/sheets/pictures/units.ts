import type { UnitSystem } from "@/db/schema/projects";
import { cToTemp, mToLength } from "@/lib/engine/units";

/** The project's unit system decides how a picture labels its axes; the data stay SI. */
export type PictureUnits = UnitSystem;

export function temperatureUnit(units: PictureUnits): "°C" | "°F" {
  return units === "imperial" ? "°F" : "°C";
}

/** °C from the engine to the display unit. */
export function displayTemperature(value_C: number, units: PictureUnits): number {
  return units === "imperial" ? cToTemp(value_C, "F") : value_C;
}

export function distanceUnit(units: PictureUnits): "m" | "ft" {
  return units === "imperial" ? "ft" : "m";
}

/** Metres from the engine to the display unit. */
export function displayDistance(value_m: number, units: PictureUnits): number {
  return units === "imperial" ? mToLength(value_m, "ft") : value_m;
}
