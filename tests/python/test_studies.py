"""The trade studies through the module against the command line with the same options: the
same documents, number for number (the same seed gives the same campaign whatever the threads
or shards); Ctrl-C stops a long call, and other Python threads run while it works."""

import _thread
import json
import math
import threading

import numpy
import pytest

from conftest import run_command, sample_path

STATION = sample_path("small-ballistic-station")
RUNS = 24


def test_a_campaign_is_the_command_lines_with_the_same_seed(ds):
    expected = run_command("disperse", STATION, "--runs", RUNS, "--seed", 7, "--json").json()
    campaign = ds.disperse(STATION, runs=RUNS, seed=7, threads=2)
    assert campaign == expected
    assert len(campaign["campaign"]["cases"]) == RUNS


def test_a_shard_and_the_ellipse_probability_are_the_command_lines(ds):
    expected = run_command("disperse", STATION, "--runs", RUNS, "--seed", 3, "--shard", "1/3",
                           "--ellipse-probability", 0.9, "--json").json()
    assert ds.disperse(STATION, runs=RUNS, seed=3, shard="1/3", ellipse_probability=0.9) == expected
    assert ds.disperse(STATION, runs=RUNS, seed=3, shard=(1, 3), ellipse_probability=0.9) == expected


def test_shards_merged_through_the_module_are_the_whole_campaign(ds, tmp_path):
    whole = ds.disperse(STATION, runs=RUNS, seed=5)
    parts = [ds.disperse(STATION, runs=RUNS, seed=5, shard=(i, 3)) for i in range(3)]
    assert ds.merge(parts) == whole
    # The command line's shard outputs, merged by the module and by the command line.
    files = []
    for i in range(3):
        file = tmp_path / f"part-{i}.json"
        file.write_text(run_command("disperse", STATION, "--runs", RUNS, "--seed", 5, "--shard",
                                    f"{i}/3", "--json").out)
        files.append(file)
    assert ds.merge(files) == whole
    # The command line writes the merged cases shard by shard (it reads one part after the
    # other), with the digest of the rows as written: in the order of their index they are the
    # whole campaign's.
    merged = run_command("merge", *files, "--json").json()
    assert merged["summary"] == whole["summary"]
    cases = merged["campaign"].pop("cases")
    assert [c["index"] for c in cases[:2]] == [0, 3]
    assert sorted(cases, key=lambda c: c["index"]) == whole["campaign"]["cases"]
    expected = dict(whole["campaign"])
    del expected["cases"]
    assert merged["campaign"].pop("cases_digest") != expected.pop("cases_digest")
    assert merged["campaign"] == expected


def test_merge_refuses_parts_of_different_campaigns(ds):
    a = ds.disperse(STATION, runs=RUNS, seed=5, shard=(0, 2))
    b = ds.disperse(STATION, runs=RUNS, seed=6, shard=(1, 2))
    with pytest.raises(ValueError):
        ds.merge([a, b])


def test_columns_hold_the_rows_cases_as_numpy_arrays(ds):
    rows = ds.disperse(STATION, runs=RUNS, seed=7)
    columns = ds.disperse(STATION, runs=RUNS, seed=7, columns=True)
    assert columns["summary"] == rows["summary"]
    cases = rows["campaign"]["cases"]
    table = columns["campaign"]["cases"]
    figures = rows["campaign"]["figures"]
    keys = [d["key"] for d in rows["campaign"]["dispersions"]]
    # The CSV's columns, in its order.
    csv = run_command("disperse", STATION, "--runs", RUNS, "--seed", 7, "--csv").out
    assert list(table) == csv.splitlines()[0].split(",")
    assert table["case"].dtype == numpy.uint64
    assert table["success"].dtype == numpy.bool_
    assert list(table["case"]) == [c["index"] for c in cases]
    for d, key in enumerate(keys):
        assert list(table[key]) == [c["draws"][d] for c in cases]
    for f, figure in enumerate(figures):
        column = table[figure]
        assert column.dtype == numpy.float64
        for value, case in zip(column, cases):
            expected = case["figures"][f]
            assert (math.isnan(value) and expected is None) or value == expected
    for p, part in enumerate(["latitude_deg", "longitude_deg", "downrange_m", "crossrange_m"]):
        for value, case in zip(table[f"landing_{part}"], cases):
            assert value == case["landing"][p] if case["landing"] else math.isnan(value)
    assert list(table["success"]) == [c["success"] for c in cases]
    assert table["failed_checks"] == [c["failed_checks"] for c in cases]


def test_a_design_without_dispersions_raises_design_error(ds):
    with pytest.raises(ds.DesignError) as raised:
        ds.disperse(sample_path("venus-atmospheric-probe"), runs=4)
    assert "dispersions" in str(raised.value)


def test_bad_options_are_refused_as_the_command_line_refuses_them(ds):
    with pytest.raises(ValueError):
        ds.disperse(STATION, shard="3/3")
    with pytest.raises(ValueError):
        ds.disperse(STATION, ellipse_probability=1.0)
    with pytest.raises(ValueError):
        ds.sweep(STATION, "aeroshell.diameter_m=2:3")
    with pytest.raises(ValueError):
        ds.sweep(STATION, ["a=1:2:2", "b=1:2:2", "c=1:2:2"])


def test_a_sweep_is_the_command_lines(ds):
    vary = ["aeroshell.diameter_m=2.2:3.4:4", "entry.flight_path_angle_deg=-16:-11:3"]
    expected = run_command("sweep", STATION, "--vary", *vary, "--json").json()
    assert ds.sweep(STATION, vary) == expected
    assert ds.sweep(STATION, [("aeroshell.diameter_m", 2.2, 3.4, 4),
                              ("entry.flight_path_angle_deg", -16, -11, 3)]) == expected
    assert len(expected["rows"]) == 12


def test_a_sweep_of_a_key_the_reader_refuses_carries_its_error(ds):
    rows = ds.sweep(STATION, "entry.velocity_m_s=-10:10:2")["rows"]
    assert rows[0]["worst_check"] == "design"
    assert "entry.velocity_m_s" in rows[0]["error"]


def test_sensitivities_are_the_command_lines(ds):
    inputs = "aeroshell.diameter_m,entry.flight_path_angle_deg"
    expected = run_command("sensitivity", STATION, "--inputs", inputs, "--json").json()
    assert ds.sensitivity(STATION, inputs=inputs) == expected
    assert ds.sensitivity(STATION, inputs=inputs.split(",")) == expected
    assert expected["inputs"] == inputs.split(",")


def test_the_corridor_is_the_command_lines(ds):
    expected = run_command("corridor", STATION, "--speeds", "5400,5800", "--runs", 0,
                           "--json").json()
    assert ds.corridor(STATION, speeds="5400,5800", runs=0) == expected
    assert ds.corridor(STATION, speeds=[5400, 5800], runs=0) == expected
    assert [row["speed"] for row in expected["speeds"]] == [5400, 5800]


def test_an_optimisation_is_the_command_lines(ds):
    expected = run_command("optimise", STATION, "--vary", "aeroshell.diameter_m=1.8:3.5",
                           "--maximise", "unallocated_mass", "--json").json()
    found = ds.optimise(STATION, {"aeroshell.diameter_m": (1.8, 3.5)},
                        maximise="unallocated_mass")
    assert found == expected
    assert found["feasible"]
    assert found["optimum_objective"] > found["design_objective"]
    assert found["binding"][0]["id"] == "deploy_dynamic_pressure_high"


def test_a_dict_design_runs_the_same_study_as_its_file(ds):
    design = json.loads(STATION.read_text())
    assert ds.disperse(design, runs=8, seed=2) == ds.disperse(STATION, runs=8, seed=2)


def test_ctrl_c_stops_a_long_campaign_with_keyboard_interrupt(ds):
    # A campaign of 10^6 cases takes the best part of an hour: interrupted after 0.5 s (as
    # Ctrl-C would be: interrupt_main simulates SIGINT arriving in the main thread), the call
    # raises KeyboardInterrupt once the cases in flight finish, and the module stays usable.
    timer = threading.Timer(0.5, _thread.interrupt_main)
    timer.start()
    try:
        with pytest.raises(KeyboardInterrupt):
            ds.disperse(STATION, runs=1_000_000, seed=1, threads=2)
    finally:
        timer.cancel()
    assert ds.disperse(STATION, runs=4, seed=1)["summary"]["runs"] == 4


def test_other_python_threads_run_while_a_campaign_works(ds):
    # With the GIL held the main thread could not count while the campaign runs; released, it
    # counts all along (a loop that takes well under a microsecond a turn, against a campaign
    # of some tenths of a second at least).
    started = threading.Event()

    def work():
        started.set()
        ds.disperse(STATION, runs=200, seed=1, threads=1)

    worker = threading.Thread(target=work)
    worker.start()
    started.wait()
    turns = 0
    while worker.is_alive():
        turns += 1
    worker.join()
    assert turns > 10_000
