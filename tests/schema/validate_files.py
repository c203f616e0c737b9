#!/usr/bin/python3
"""Validates every example stage file and every shipped device file against
the JSON Schemas in schema/ (draft 2020-12), and checks that the schemas
refuse files they must refuse (an unknown key, a missing band, a device of
an unknown kind), so a schema that accepts everything fails here.

Needs Debian's python3-jsonschema (scripts/setup installs it). Without it
the test is skipped (exit 77) with a message, except under CI (the CI
environment variable set), where a missing validator is a failure.
Usage: validate_files.py SOURCE_DIR
"""
import copy
import json
import os
import pathlib
import sys

try:
    from jsonschema import Draft202012Validator, RefResolver
except ImportError:
    print("skipped: python3-jsonschema is not installed (scripts/setup)")
    sys.exit(1 if os.environ.get("CI") else 77)

root = pathlib.Path(sys.argv[1]).resolve()
failures = []


def validator(name):
    path = root / "schema" / f"{name}.schema.json"
    schema = json.loads(path.read_text())
    Draft202012Validator.check_schema(schema)
    # Relative $refs (stage -> device) resolve against the schema's file.
    return Draft202012Validator(schema, resolver=RefResolver(path.as_uri(), schema))


def errors(v, instance):
    return [f"{'/'.join(map(str, e.absolute_path))}: {e.message}"
            for e in v.iter_errors(instance)]


stage = validator("stage")
device = validator("device")
# The examples, and the pairs in their own folders (a stage and the second
# stage file it names).
examples = sorted((root / "examples").glob("*.json")) + sorted(
    (root / "examples").glob("*/*.json"))
devices = sorted((root / "devices").glob("*/*.json"))
if not examples or not devices:
    failures.append("no examples or no device files found")
for path, v in [(p, stage) for p in examples] + [(p, device) for p in devices]:
    found = errors(v, json.loads(path.read_text()))
    if found:
        failures.append(f"{path.relative_to(root)}: " + "; ".join(found))

# Files the schemas must refuse.
base = json.loads((root / "examples" / "geophone-preamp.json").read_text())
bad = []
typo = copy.deepcopy(base); typo["stage"]["lod"] = "2k"; bad.append(("stage key typo", stage, typo))
noband = copy.deepcopy(base); del noband["band_Hz"]; bad.append(("no band", stage, noband))
both = copy.deepcopy(base); both["stage"]["feedback"]["resistor"] = "1M"; bad.append(("resistor and tee", stage, both))
pd = copy.deepcopy(base); pd["stage"]["topology"] = "transimpedance"; bad.append(("transimpedance with a voltage source", stage, pd))
twosrc = copy.deepcopy(base); twosrc["source"]["photodiode"] = {"capacitance": "10p"}; bad.append(("a voltage source and a photodiode", stage, twosrc))
twocap = copy.deepcopy(base); twocap["source"]["voltage"] = {}; twocap["source"]["capacitive"] = {"capacitance": "1n"}; bad.append(("a voltage source and a capacitive sensor", stage, twocap))
nocap = copy.deepcopy(base); nocap["source"].pop("voltage", None); nocap["source"]["capacitive"] = {"leakage_resistance": "1G"}; bad.append(("a capacitive sensor without capacitance", stage, nocap))
noper = copy.deepcopy(base); noper["source"]["sensitivity"] = {"value": "2 mV"}; bad.append(("sensitivity without per", stage, noper))
mixed = copy.deepcopy(base); mixed["chain"] = {"second_stage": {"stage": "s.json", "gain": 10}, "adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"}}; bad.append(("a second stage file with a gain", stage, mixed))
opamp = json.loads(devices[0].read_text())
kind = copy.deepcopy(opamp); kind["kind"] = "comparator"; bad.append(("device kind", device, kind))
param = copy.deepcopy(opamp); param["parameters"]["gbw_hz"] = 1e6; bad.append(("parameter typo", device, param))
for what, v, instance in bad:
    if not errors(v, instance):
        failures.append(f"the schema accepts a file it must refuse: {what}")

for f in failures:
    print(f)
print(f"{len(examples)} stage files and {len(devices)} device files checked, "
      f"{len(bad)} bad files refused, {len(failures)} failures")
sys.exit(1 if failures else 0)
