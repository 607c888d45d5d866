package units

import (
	"fmt"
	"math"
)

// U.S. Standard Atmosphere, 1976 (NOAA-S/T 76-1562), troposphere layer (base 0 m geopotential).
const (
	stdT0     = 288.15    // K, sea-level temperature, Table 4
	stdLapse  = -0.0065   // K/m', temperature gradient of the first layer, Table 4
	stdM0     = 0.0289644 // kg/mol, sea-level mean molar mass of air
	stdRStar  = 8.31432   // J/(mol K), gas constant as adopted by the 1976 standard
	stdRadius = 6356766.0 // m, effective Earth radius r0 for geopotential altitude
	minElev   = -500.0    // m
	maxElev   = 11000.0   // m, just below the tropopause (11 km' geopotential)
)

// AtmosphereAt returns the standard-atmosphere pressure in Pa at a site elevation in metres above
// mean sea level, from the U.S. Standard Atmosphere 1976 (identical to the ICAO standard
// atmosphere in the troposphere). Elevations outside -500 m .. 11000 m are an error: above that
// the lapse rate changes, and no plant sits there.
func AtmosphereAt(elevation float64) (float64, error) {
	if math.IsNaN(elevation) || elevation < minElev || elevation > maxElev {
		return 0, fmt.Errorf("elevation %s m is outside the standard-atmosphere range %g m to %g m",
			Format(elevation, 6), minElev, maxElev)
	}
	// Geopotential altitude H = r0 Z / (r0 + Z), U.S. Standard Atmosphere 1976, eq. 18.
	h := stdRadius * elevation / (stdRadius + elevation)
	// P = Pb [Tb / (Tb + Lb (H - Hb))]^(g0' M0 / (R* Lb)), U.S. Standard Atmosphere 1976, eq. 33a,
	// with Pb = 101325 Pa, Hb = 0.
	exp := standardGravity * stdM0 / (stdRStar * stdLapse)
	return StandardAtmosphere * math.Pow(stdT0/(stdT0+stdLapse*h), exp), nil
}
