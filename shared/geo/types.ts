/** GeoJSON geometry in WGS84, [longitude, latitude] in degrees (RFC 7946). */
export type Position = [lon: number, lat: number]
export type Ring = Position[]

export interface Polygon {
  type: 'Polygon'
  /** The first ring is the shoreline; later rings are islands. */
  coordinates: Ring[]
}

export interface MultiPolygon {
  type: 'MultiPolygon'
  coordinates: Ring[][]
}

export type LakeGeometry = Polygon | MultiPolygon
