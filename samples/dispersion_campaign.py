#!/usr/bin/env python3
"""A dispersion campaign from Python (a demo scenario of our own): the Earth return capsule,
given an entry heading and a dispersion of it besides its own, flown over its dispersions; its
touchdown speed under the canopy as a NumPy histogram, and its landing points with the 99 %
landing ellipse, drawn with matplotlib where it is installed.

    PYTHONPATH=build python3 samples/dispersion_campaign.py [--runs N] [--seed S] [--plot OUT.png]

The results are conceptual estimates, to be confirmed by detailed analysis and test.
"""

import argparse
import json
import math
import pathlib

import numpy

import descent_sizer

DESIGN = pathlib.Path(__file__).resolve().parent / "earth-return-capsule.json"


def scripted_design():
    """The capsule's design document, given an entry heading and a dispersion of it."""
    design = json.loads(DESIGN.read_text())
    design["entry"]["azimuth_deg"] = 60.0  # over the rotating Earth, heading north-east
    design["dispersions"].append(
        {"key": "entry.azimuth_deg", "distribution": "normal", "sigma": 0.2})
    return design


def touchdown_histogram(cases):
    """Counts and bin edges of the touchdown speeds (m/s) of the cases that have one: the
    square root of the cases as bins, 5 to 50 (common practice)."""
    speeds = cases["touchdown_speed"][~numpy.isnan(cases["touchdown_speed"])]
    bins = min(50, max(5, round(math.sqrt(len(speeds)))))
    return numpy.histogram(speeds, bins=bins)


def east_north_km(cases, ellipse, radius_m):
    """The landing points in km east and north of the ellipse's centre: the azimuthal
    equidistant projection (distance and azimuth from the centre kept), as the core makes it."""
    lat0, lon0 = numpy.radians([ellipse["centre_latitude_deg"], ellipse["centre_longitude_deg"]])
    lat = numpy.radians(cases["landing_latitude_deg"])
    dlon = numpy.radians(cases["landing_longitude_deg"]) - lon0
    landed = ~numpy.isnan(lat)
    lat, dlon = lat[landed], dlon[landed]
    cos_angle = numpy.sin(lat0) * numpy.sin(lat) + numpy.cos(lat0) * numpy.cos(lat) * numpy.cos(dlon)
    distance_km = radius_m * numpy.arccos(numpy.clip(cos_angle, -1.0, 1.0)) / 1000.0
    azimuth = numpy.arctan2(numpy.sin(dlon) * numpy.cos(lat),
                            numpy.cos(lat0) * numpy.sin(lat)
                            - numpy.sin(lat0) * numpy.cos(lat) * numpy.cos(dlon))
    return distance_km * numpy.sin(azimuth), distance_km * numpy.cos(azimuth)


def ellipse_outline_km(ellipse, points=181):
    """The landing ellipse's outline in km east and north of its centre."""
    t = numpy.linspace(0.0, 2.0 * math.pi, points)
    along = ellipse["semi_major_km"] * numpy.cos(t)
    across = ellipse["semi_minor_km"] * numpy.sin(t)
    azimuth = math.radians(ellipse["major_axis_azimuth_deg"])  # from north, clockwise
    return (along * math.sin(azimuth) + across * math.cos(azimuth),
            along * math.cos(azimuth) - across * math.sin(azimuth))


def plot(cases, result, counts, edges, output):
    try:
        import matplotlib
    except ImportError:
        print("matplotlib is not installed: no plot (apt-get install python3-matplotlib)")
        return
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    ellipse = result["summary"]["landing_ellipse"]
    east, north = east_north_km(cases, ellipse, result["campaign"]["body_radius_m"])
    outline_east, outline_north = ellipse_outline_km(ellipse)
    figure, (left, right) = plt.subplots(1, 2, figsize=(11, 4.5))
    left.stairs(counts, edges, fill=True)
    left.set_xlabel("touchdown speed (m/s)")
    left.set_ylabel("cases")
    right.plot(east, north, ".", markersize=3, label="landing points")
    right.plot(outline_east, outline_north, label=f"{100 * ellipse['probability']:g} % ellipse")
    right.set_xlabel("east of the mean (km)")
    right.set_ylabel("north of the mean (km)")
    right.set_aspect("equal", adjustable="datalim")
    right.legend()
    figure.suptitle(f"{result['summary']['runs']} dispersed cases (conceptual estimates)")
    figure.tight_layout()
    figure.savefig(output, dpi=120)
    print(f"plot written to {output}")


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=1000)
    parser.add_argument("--seed", type=int, default=7)
    parser.add_argument("--plot", default="dispersion-campaign.png", help="the picture (PNG)")
    parser.add_argument("--no-plot", action="store_true")
    options = parser.parse_args()

    result = descent_sizer.disperse(scripted_design(), runs=options.runs, seed=options.seed, columns=True,
                                    base_directory=DESIGN.parent)
    cases = result["campaign"]["cases"]
    summary = result["summary"]
    print(f"{summary['successes']} of {summary['runs']} cases pass every check")
    counts, edges = touchdown_histogram(cases)
    print("touchdown speed (m/s)   cases")
    for count, low, high in zip(counts, edges, edges[1:]):
        print(f"  {low:6.3f} to {high:6.3f}  {count:6d}  {'#' * round(60 * count / counts.max())}")
    ellipse = summary["landing_ellipse"]
    print(f"landing ellipse ({100 * ellipse['probability']:g} %): {ellipse['semi_major_km']:.2f} by "
          f"{ellipse['semi_minor_km']:.2f} km, major axis at {ellipse['major_axis_azimuth_deg']:.1f} deg")
    if not options.no_plot:
        plot(cases, result, counts, edges, options.plot)


if __name__ == "__main__":
    main()
