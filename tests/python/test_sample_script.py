"""samples/dispersion_campaign.py, the example of the module, without matplotlib: it runs, its
histogram counts every case, and its landing points give back the core's landing ellipse."""

import importlib.util
import math
import os
import subprocess
import sys

import numpy
import pytest

from conftest import SAMPLES_DIR

SCRIPT = SAMPLES_DIR / "dispersion_campaign.py"


@pytest.fixture(scope="module")
def script():
    spec = importlib.util.spec_from_file_location("dispersion_campaign", SCRIPT)
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def test_the_script_runs_and_prints_its_histogram_and_ellipse():
    run = subprocess.run([sys.executable, str(SCRIPT), "--runs", "40", "--no-plot"],
                         capture_output=True, text=True, env=os.environ, check=False)
    assert run.returncode == 0, run.stderr
    assert "touchdown speed (m/s)" in run.stdout
    assert "landing ellipse (99 %)" in run.stdout


def test_the_histogram_counts_every_touchdown_and_the_points_give_the_cores_ellipse(ds, script):
    campaign = ds.disperse(script.scripted_design(), runs=60, seed=3, columns=True)
    cases = campaign["campaign"]["cases"]
    counts, edges = script.touchdown_histogram(cases)
    assert counts.sum() == numpy.count_nonzero(~numpy.isnan(cases["touchdown_speed"])) == 60
    assert len(counts) == round(math.sqrt(60))

    # The ellipse holding p of a bivariate normal of the points' sample covariance: semi-axes
    # k sqrt(eigenvalues), k^2 = -2 ln(1 - p), the chi-square quantile with 2 degrees of
    # freedom (closed form); the projection is the script's own NumPy one.
    ellipse = campaign["summary"]["landing_ellipse"]
    east, north = script.east_north_km(cases, ellipse, campaign["campaign"]["body_radius_m"])
    eigenvalues = numpy.linalg.eigvalsh(numpy.cov(numpy.vstack([east, north])))
    k = math.sqrt(-2.0 * math.log1p(-ellipse["probability"]))
    assert k * math.sqrt(eigenvalues[1]) == pytest.approx(ellipse["semi_major_km"], rel=1e-9)
    assert ellipse["semi_minor_km"] > 1.0  # the heading's dispersion spreads it sideways
    assert k * math.sqrt(eigenvalues[0]) == pytest.approx(ellipse["semi_minor_km"], rel=1e-9)
