// Solar elevation for the automatic day/night display, with the NOAA solar position algorithm
// (the NOAA Global Monitoring Laboratory solar calculator, after Meeus, "Astronomical
// Algorithms"). Accurate to about 0.01° over 1800-2100, far more than a display switch needs.

import type { IsoUtc } from './model.ts';

const RAD = Math.PI / 180;
const sin = (d: number): number => Math.sin(d * RAD);
const cos = (d: number): number => Math.cos(d * RAD);
const tan = (d: number): number => Math.tan(d * RAD);

export interface SolarPosition {
  /** Geometric elevation of the sun's centre above the horizon, degrees. */
  elevationDeg: number;
  /** Elevation with the NOAA approximation of atmospheric refraction added, degrees. */
  apparentElevationDeg: number;
  /** Azimuth, degrees clockwise from true north. */
  azimuthDeg: number;
  /** Apparent declination and right ascension of the sun, degrees (RA 0..360). */
  declinationDeg: number;
  rightAscensionDeg: number;
  /** Apparent ecliptic longitude of the sun, degrees 0..360. */
  apparentLongitudeDeg: number;
  equationOfTimeMin: number;
}

function toMs(time: IsoUtc | number | Date): number {
  if (time instanceof Date) return time.getTime();
  return typeof time === 'number' ? time : Date.parse(time);
}

/** NOAA refraction correction in degrees for a geometric elevation in degrees. */
export function refractionDeg(elevationDeg: number): number {
  const e = elevationDeg;
  let arcsec: number;
  if (e > 85) arcsec = 0;
  else if (e > 5) arcsec = 58.1 / tan(e) - 0.07 / tan(e) ** 3 + 0.000086 / tan(e) ** 5;
  else if (e > -0.575) arcsec = 1735 + e * (-518.2 + e * (103.4 + e * (-12.79 + e * 0.711)));
  else arcsec = -20.772 / tan(e);
  return arcsec / 3600;
}

/** Sun position at a time (UTC) and place (WGS 84 degrees, east positive). */
export function solarPosition(time: IsoUtc | number | Date, lat: number, lon: number): SolarPosition {
  const ms = toMs(time);
  const jd = ms / 86400000 + 2440587.5;
  const t = (jd - 2451545) / 36525;
  const l0 = (((280.46646 + t * (36000.76983 + t * 0.0003032)) % 360) + 360) % 360;
  const m = 357.52911 + t * (35999.05029 - 0.0001537 * t);
  const ecc = 0.016708634 - t * (0.000042037 + 0.0000001267 * t);
  const c = sin(m) * (1.914602 - t * (0.004817 + 0.000014 * t)) + sin(2 * m) * (0.019993 - 0.000101 * t) + sin(3 * m) * 0.000289;
  const trueLong = l0 + c;
  const omega = 125.04 - 1934.136 * t;
  const appLong = trueLong - 0.00569 - 0.00478 * sin(omega);
  const meanObliq = 23 + (26 + (21.448 - t * (46.815 + t * (0.00059 - t * 0.001813))) / 60) / 60;
  const obliq = meanObliq + 0.00256 * cos(omega);
  const decl = Math.asin(sin(obliq) * sin(appLong)) / RAD;
  const ra = ((Math.atan2(cos(obliq) * sin(appLong), cos(appLong)) / RAD) % 360 + 360) % 360;
  const y = tan(obliq / 2) ** 2;
  const eot = (4 / RAD) * (y * sin(2 * l0) - 2 * ecc * sin(m) + 4 * ecc * y * sin(m) * cos(2 * l0)
    - 0.5 * y * y * sin(4 * l0) - 1.25 * ecc * ecc * sin(2 * m));
  const minutesOfDay = ((ms % 86400000) + 86400000) % 86400000 / 60000;
  const trueSolarTime = (((minutesOfDay + eot + 4 * lon) % 1440) + 1440) % 1440;
  const hourAngle = trueSolarTime / 4 < 0 ? trueSolarTime / 4 + 180 : trueSolarTime / 4 - 180;
  const cosZenith = Math.min(1, Math.max(-1, sin(lat) * sin(decl) + cos(lat) * cos(decl) * cos(hourAngle)));
  const zenith = Math.acos(cosZenith) / RAD;
  const elevationDeg = 90 - zenith;
  // Azimuth (NOAA spreadsheet form), clockwise from north.
  const sinZ = Math.sin(zenith * RAD);
  let azimuthDeg: number;
  if (Math.abs(sinZ) < 1e-12 || Math.abs(cos(lat)) < 1e-12) {
    azimuthDeg = lat > 0 ? 180 : 0;
  } else {
    const a = Math.acos(Math.min(1, Math.max(-1, (sin(lat) * cosZenith - sin(decl)) / (cos(lat) * sinZ)))) / RAD;
    azimuthDeg = hourAngle > 0 ? (a + 180) % 360 : (540 - a) % 360;
  }
  return {
    elevationDeg,
    apparentElevationDeg: elevationDeg + refractionDeg(elevationDeg),
    azimuthDeg,
    declinationDeg: decl,
    rightAscensionDeg: ra,
    apparentLongitudeDeg: ((appLong % 360) + 360) % 360,
    equationOfTimeMin: eot,
  };
}

/** Geometric solar elevation in degrees at a time and place. */
export function solarElevationDeg(time: IsoUtc | number | Date, lat: number, lon: number): number {
  return solarPosition(time, lat, lon).elevationDeg;
}

export type DisplayTheme = 'day' | 'night';

/**
 * The night display comes on at the end of civil twilight: the geometric centre of the sun 6°
 * below the horizon, refraction not counted (the definition the NOAA solar calculator uses; the
 * switch to a dark display at that moment is our choice). A half-degree hysteresis either side
 * keeps the display from flickering when the sun skims the threshold, as it does for hours in
 * polar twilight.
 */
export const NIGHT_BELOW_DEG = -6;
export const THEME_HYSTERESIS_DEG = 0.5;

export function themeForSunElevation(elevationDeg: number, current?: DisplayTheme): DisplayTheme {
  if (current === 'day') return elevationDeg < NIGHT_BELOW_DEG - THEME_HYSTERESIS_DEG ? 'night' : 'day';
  if (current === 'night') return elevationDeg > NIGHT_BELOW_DEG + THEME_HYSTERESIS_DEG ? 'day' : 'night';
  return elevationDeg >= NIGHT_BELOW_DEG ? 'day' : 'night';
}

/** The display theme for a time and place (geometric elevation of the sun's centre). */
export function themeAt(time: IsoUtc | number | Date, lat: number, lon: number, current?: DisplayTheme): DisplayTheme {
  return themeForSunElevation(solarPosition(time, lat, lon).elevationDeg, current);
}
