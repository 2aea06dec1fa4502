/** A ground station as plain data; `src/events/station.ts` holds its geometry. */

/** A ground station as the scenario gives it (contract: `stations[]`). */
export interface Station {
  /** Station id, unique within a scenario. */
  id: string;
  /** Geodetic latitude [deg], WGS-84, −90..90. */
  latDeg: number;
  /** Longitude [deg], east positive. */
  lonDeg: number;
  /** Height above the WGS-84 ellipsoid [m]. */
  heightM: number;
  /** Geoid undulation N at the site [m] (for the station clock rate; unused by geometry). */
  geoidHeightM: number;
  /** Elevation mask [deg]: AOS and LOS are the crossings of this elevation. Geometric, no refraction. */
  maskDeg: number;
  /** Shortest pass worth reporting [s] (time above the mask). */
  minPassS: number;
}
