"""size() against the command line: the same results document, number for number, and the
same reader messages for designs it refuses."""

import copy
import json

import pytest

from conftest import SAMPLES, run_command, sample_document, sample_path


@pytest.mark.parametrize("name", SAMPLES)
def test_size_of_a_sample_file_is_the_command_lines_json_exactly(ds, name):
    # Exact: both are the core's results document; the command line prints each double so that
    # it reads back the same (nlohmann::json), the module hands over the double itself.
    expected = run_command("size", sample_path(name), "--json").json()
    assert ds.size(sample_path(name)) == expected


@pytest.mark.parametrize("name", SAMPLES)
def test_size_of_a_sample_as_a_dict_is_the_same_as_of_its_file(ds, name):
    assert ds.size(sample_document(name)) == ds.size(str(sample_path(name)))


def test_size_with_history_is_the_command_lines_json_with_history(ds):
    name = "small-ballistic-station"
    expected = run_command("size", sample_path(name), "--json", "--history").json()
    results = ds.size(sample_path(name), history=True)
    assert len(results["history"]) > 10
    assert results == expected


def test_the_results_are_the_documents_of_the_contract(ds):
    results = ds.size(sample_path("small-ballistic-station"))
    assert results["format"] == "descent-sizer/results"
    assert isinstance(results["entry"]["peak_deceleration_g"], float)
    assert results["notes"][0] == ds.caution


def bad_variants():
    """Designs the reader refuses, each with the change that breaks it."""
    station = sample_document("small-ballistic-station")
    negative = copy.deepcopy(station)
    negative["entry"]["velocity_m_s"] = -10.0
    unknown = copy.deepcopy(station)
    unknown["aeroshell"]["colour"] = "red"
    several = copy.deepcopy(negative)
    several["aeroshell"]["colour"] = "red"
    del several["mass"]
    newer = copy.deepcopy(station)
    newer["version"] = 99
    return {"negative velocity": negative, "unknown key": unknown, "several": several,
            "newer version": newer}


@pytest.mark.parametrize("case", sorted(bad_variants()))
def test_a_bad_design_raises_design_error_with_the_command_lines_messages(ds, case, tmp_path):
    design = bad_variants()[case]
    file = tmp_path / "bad.json"
    file.write_text(json.dumps(design, indent=2))
    run = run_command("size", file)
    assert run.exit_code == 2
    # The command line prints "FILE: key: message", a line per error, in document order.
    expected = [line.removeprefix(f"{file}: ") for line in run.err.splitlines()]
    assert expected

    for given in (file, design):
        with pytest.raises(ds.DesignError) as raised:
            ds.size(given)
        assert raised.value.messages == expected
        assert str(raised.value) == "\n".join(expected)
        assert [f"{e['key']}: {e['message']}" for e in raised.value.errors] == expected


def test_design_error_names_every_key_path(ds):
    design = bad_variants()["several"]
    with pytest.raises(ds.DesignError) as raised:
        ds.size(design)
    keys = [error["key"] for error in raised.value.errors]
    assert "entry.velocity_m_s" in keys
    assert "aeroshell.colour" in keys
    assert "mass" in keys
    assert isinstance(raised.value, ValueError)


def test_text_that_is_not_json_raises_design_error_as_the_command_line_says(ds, tmp_path):
    file = tmp_path / "broken.json"
    file.write_text('{"version": 1,\n "name": }')
    run = run_command("size", file)
    with pytest.raises(ds.DesignError) as raised:
        ds.size(file)
    assert raised.value.messages == [line.removeprefix(f"{file}: ")
                                     for line in run.err.splitlines()]


def test_a_design_that_is_neither_a_dict_nor_a_path_is_a_type_error(ds):
    with pytest.raises(TypeError):
        ds.size(42)
    with pytest.raises(TypeError):
        ds.size({"version": object()})


def test_read_design_gives_back_a_design_it_accepts(ds):
    design = sample_document("earth-return-capsule")
    assert ds.read_design(design) == design


def test_a_dicts_relative_paths_start_from_base_directory(ds, tmp_path):
    # A table atmosphere's csv_file, relative: found from base_directory (a str or a path), as
    # a file's own folder serves for a design file.
    design = sample_document("small-ballistic-station")
    air = ds.atmosphere("mars", [-5000.0, 0.0, 20000.0, 40000.0, 60000.0, 80000.0, 125000.0])
    rows = zip(air["altitude_m"], air["density_kg_m3"], air["temperature_K"])
    (tmp_path / "air.csv").write_text(
        "altitude_m,density_kg_m3,temperature_K\n"
        + "".join(f"{h!r},{rho!r},{t!r}\n" for h, rho, t in rows))
    design["atmosphere"] = {"model": "table", "csv_file": "air.csv"}
    with pytest.raises(ds.DesignError):
        ds.size(design)
    results = ds.size(design, base_directory=tmp_path)
    assert results == ds.size(design, base_directory=str(tmp_path))
    file = tmp_path / "design.json"
    file.write_text(json.dumps(design))
    assert ds.size(file) == results
    with pytest.raises(TypeError):
        ds.size(design, base_directory=3)
