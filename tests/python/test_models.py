"""The models of the core as the module gives them, against published values: the 1976
standard's table rows, the Newtonian sphere-cone closed forms, Sutton-Graves by hand."""

import math

import numpy
import pytest

from conftest import sample_document, sample_path

# US Standard Atmosphere, 1976 (NOAA/NASA/USAF) at geometric altitudes, as listed in
# references.md ("derived from its constants"); the C++ suite checks the same rows
# (tests/core/atmosphere/test_us_standard_1976.cpp): altitude m, T K, rho kg/m^3.
US_STANDARD_1976_ROWS = [
    (0.0, 288.150, 1.2250),
    (10000.0, 223.252, 0.41351),
    (20000.0, 216.650, 0.088910),
    (30000.0, 226.509, 0.018410),
    (50000.0, 270.650, 1.0269e-3),
    (70000.0, 219.585, 8.2829e-5),
]
TEMPERATURE_TOLERANCE_K = 0.01
DENSITY_RELATIVE_TOLERANCE = 1e-4

# The same standard's tables above 86 km (transcribed in the open-source COESA.jl package; the
# standard itself not re-read), as the C++ suite has them: altitude m, T K, rho kg/m^3, M.
US_STANDARD_1976_UPPER_ROWS = [
    (91000.0, 186.87, 2.860e-6, 28.89),
    (120000.0, 360.00, 2.222e-8, 26.20),
    (500000.0, 999.24, 5.215e-13, 14.33),
]
PRINTED_TEMPERATURE_TOLERANCE_K = 0.005


def upper_density_tolerance(density, molar_mass):
    """The printed M's half unit (0.005 kg/kmol) and the printed density's (half a unit in its
    fourth figure), relative, as the C++ suite takes them."""
    mantissa = density / 10 ** math.floor(math.log10(density))
    return 0.005 / molar_mass + 0.0005 / mantissa


def test_earths_atmosphere_matches_the_us_standard_atmosphere_1976_rows(ds):
    altitudes = numpy.array([row[0] for row in US_STANDARD_1976_ROWS])
    air = ds.atmosphere("earth", altitudes)
    assert air["altitude_m"].tolist() == altitudes.tolist()
    for i, (altitude, temperature, density) in enumerate(US_STANDARD_1976_ROWS):
        assert abs(air["temperature_K"][i] - temperature) <= TEMPERATURE_TOLERANCE_K, altitude
        assert air["density_kg_m3"][i] == pytest.approx(density, rel=DENSITY_RELATIVE_TOLERANCE)


def test_earths_atmosphere_matches_the_1976_tables_above_86_km(ds):
    for altitude, temperature, density, molar_mass in US_STANDARD_1976_UPPER_ROWS:
        air = ds.atmosphere("earth", altitude)
        assert abs(float(air["temperature_K"]) - temperature) <= PRINTED_TEMPERATURE_TOLERANCE_K
        assert float(air["density_kg_m3"]) == pytest.approx(
            density, rel=upper_density_tolerance(density, molar_mass))


def test_the_speed_of_sound_at_sea_level_is_that_of_the_1976_constants(ds):
    # sqrt(1.4 x 8314.32 / 28.9644 x 288.15) = 340.294 m/s, derived from the standard's
    # constants (the standard tabulates 340.294, from memory).
    assert float(ds.atmosphere("earth", 0.0)["speed_of_sound_m_s"]) == pytest.approx(
        340.294, rel=1e-6)


def test_the_atmosphere_keeps_the_altitudes_shape(ds):
    grid = numpy.linspace(0.0, 60000.0, 12).reshape(3, 4)
    air = ds.atmosphere("mars", grid)
    for key in ("density_kg_m3", "temperature_K", "speed_of_sound_m_s"):
        assert air[key].shape == (3, 4)
    assert numpy.all(numpy.diff(air["density_kg_m3"].ravel()) < 0)


def test_a_designs_atmosphere_is_its_body_standard_one_times_its_density_scale(ds):
    # The capsule flies the 1976 standard; a density scale multiplies the density alone.
    design = sample_document("earth-return-capsule")
    assert design["atmosphere"]["model"] == "standard"
    design["atmosphere"]["density_scale"] = 1.1
    altitudes = [0.0, 30000.0, 80000.0]
    scaled = ds.atmosphere(design, altitudes)
    standard = ds.atmosphere("earth", altitudes)
    numpy.testing.assert_allclose(scaled["density_kg_m3"], 1.1 * standard["density_kg_m3"],
                                  rtol=1e-14)
    numpy.testing.assert_array_equal(scaled["temperature_K"], standard["temperature_K"])
    assert ds.atmosphere(sample_path("earth-return-capsule"), altitudes)["temperature_K"].tolist() \
        == standard["temperature_K"].tolist()


def test_an_unknown_body_or_a_bad_design_is_refused(ds):
    with pytest.raises(ds.DesignError):
        ds.atmosphere("pluto", [0.0])  # not a preset, so a path, which does not exist
    with pytest.raises(ds.DesignError):
        ds.atmosphere({"version": 1}, [0.0])


def test_the_sphere_cone_drag_coefficient_has_the_newtonian_closed_forms(ds):
    # Newtonian theory (references.md): a hemisphere (bluntness 1, the cone's half-angle to 0)
    # gives 1, a near-sharp cone 2 sin^2 d; 70 deg at bluntness 0.5 gives 1.7695.
    assert ds.sphere_cone_drag_coefficient(1e-6, 1.0, 2.0) == pytest.approx(1.0, rel=1e-12)
    sharp = ds.sphere_cone_drag_coefficient(30.0, 1e-6, 2.0)
    assert sharp == pytest.approx(2.0 * math.sin(math.radians(30.0)) ** 2, rel=1e-9)
    assert ds.sphere_cone_drag_coefficient(70.0, 0.5, 2.0) == pytest.approx(1.7695, abs=5e-5)


def test_modified_newtonian_scales_by_the_rayleigh_pitot_limit(ds):
    # Cp_max behind a normal shock at infinite Mach (Rayleigh pitot formula) is
    # ((g+1)^2 / (4 g))^(g/(g-1)) * 4 / (g+1): 1.839 for gamma 1.4 (references.md: 1.838).
    g = 1.4
    cp_max = ((g + 1) ** 2 / (4 * g)) ** (g / (g - 1)) * 4 / (g + 1)
    assert cp_max == pytest.approx(1.839, abs=1e-3)
    assert ds.sphere_cone_drag_coefficient(1e-6, 1.0, 2.0, gamma=g) == pytest.approx(
        cp_max / 2, rel=1e-12)


def test_the_drag_against_mach_falls_to_the_isentropic_value_at_low_speed(ds):
    # Below Mach 1 the stagnation pressure coefficient is the isentropic compression's,
    # Cp = 2/(g M^2) ((1 + (g-1)/2 M^2)^(g/(g-1)) - 1); Cd scales with Cp / Cp_max(infinity).
    g, mach = 1.4, numpy.array([0.5, 50.0])
    hypersonic = ds.sphere_cone_drag_coefficient(70.0, 0.5, 2.0, gamma=g)
    cd = ds.sphere_cone_drag_coefficient(70.0, 0.5, 2.0, gamma=g, mach=mach)
    cp_max = ((g + 1) ** 2 / (4 * g)) ** (g / (g - 1)) * 4 / (g + 1)
    m = mach[0]
    cp_low = 2 / (g * m * m) * ((1 + (g - 1) / 2 * m * m) ** (g / (g - 1)) - 1)
    assert cd[0] == pytest.approx(hypersonic * cp_low / cp_max, rel=1e-9)
    assert cd[1] == pytest.approx(hypersonic, rel=1e-3)
    with pytest.raises(ValueError):
        ds.sphere_cone_drag_coefficient(70.0, 0.5, 2.0, mach=2.0)
    with pytest.raises(ValueError):
        ds.sphere_cone_drag_coefficient(70.0, 2.0, 2.0)


def test_sutton_graves_is_its_formula_by_hand(ds):
    # NASA TR R-376 (1971): q = k sqrt(rho / Rn) V^3 W/m^2, k = 1.9027e-4 (CO2) and 1.7415e-4
    # (air) kg^0.5/m (references.md). By hand: rho 1e-4, Rn 0.5 m, V 5000 m/s in CO2:
    # 1.9027e-4 x sqrt(2e-4) x 1.25e11 = 3.3635e5 W/m^2.
    assert ds.sutton_graves(1e-4, 5000.0, 0.5, body="mars") == pytest.approx(3.3635e5, rel=1e-4)
    assert ds.sutton_graves(1e-4, 5000.0, 0.5, k=1.7415e-4) == pytest.approx(
        1.7415e-4 * math.sqrt(2e-4) * 5000.0 ** 3, rel=1e-12)
    flux = ds.sutton_graves(numpy.array([1e-4, 4e-4]), numpy.array([5000.0, 2500.0]), 0.5,
                            body="earth")
    assert flux[1] / flux[0] == pytest.approx(2.0 / 8.0, rel=1e-12)
    with pytest.raises(ValueError):
        ds.sutton_graves(1e-4, 5000.0, 0.5)
    with pytest.raises(ValueError):
        ds.sutton_graves(1e-4, 5000.0, 0.5, body="pluto")


def test_a_canopys_drag_against_mach_follows_its_table(ds):
    # The module's curve is the core's table (canopy_types()), linear between its points and
    # flat outside them, times the subsonic Cd; a consistency check of the binding, the table's
    # own source being AGARD-AG-319 (see core/parachute/canopy.cpp).
    types = ds.canopy_types()
    assert set(types) == {"disk-gap-band", "ringsail"}
    band = types["disk-gap-band"]
    table = numpy.array(band["mach_factor"])
    mach = numpy.linspace(0.0, 3.0, 31)
    expected = band["drag_coefficient"] * numpy.interp(mach, table[:, 0], table[:, 1])
    numpy.testing.assert_allclose(ds.canopy_drag_coefficient("disk-gap-band", mach), expected,
                                  rtol=1e-12)
    # AGARD-AG-319: subsonic 0.53-0.58, supersonic 0.3-0.5.
    assert 0.53 <= ds.canopy_drag_coefficient("disk-gap-band", 0.5) <= 0.58
    assert 0.3 <= ds.canopy_drag_coefficient("disk-gap-band", 2.0) <= 0.5
    assert ds.canopy_drag_coefficient("ringsail", 0.5, drag_coefficient=0.85) == 0.85
    with pytest.raises(ValueError):
        ds.canopy_drag_coefficient("cross", 0.5)


def test_the_body_presets_give_the_sutton_graves_constants(ds):
    bodies = ds.body_presets()
    assert bodies["mars"]["sutton_graves_k"] == pytest.approx(1.9027e-4, rel=1e-12)
    assert bodies["earth"]["sutton_graves_k"] == pytest.approx(1.7415e-4, rel=1e-12)
