#!/usr/bin/env python3
"""Checks coilspin result files against docs/result-format-2.schema.json, and
verification files against docs/verification-format-1.schema.json.

Usage: validate_result.py SCHEMA FILE.json [FILE.json ...]

The other *.schema.json files beside SCHEMA are known by their $id, so that
one schema may refer to another (a result's "verification" block is the
verification schema's). Besides the schema (python3-jsonschema, Debian), checks
what JSON Schema cannot say of a result file: the covariance and correlation
are square, one row per name, symmetric exactly; their names are parameters; a
torque constant taken equal to Ke has Ke's row; the correlation has 1 on its
diagonal. Prints one line per problem and exits 1 when there is any.
"""
import glob
import json
import os
import sys

import jsonschema


def matrix_problems(result, key):
    block = result[key]
    names, matrix = block["names"], block["matrix"]
    problems = []
    if len(matrix) != len(names) or any(len(row) != len(names) for row in matrix):
        return [f"{key}: not square with one row per name"]
    for a in range(len(names)):
        if names[a] not in result["parameters"]:
            problems.append(f"{key}: {names[a]} is not a parameter")
        for b in range(a):
            if matrix[a][b] != matrix[b][a]:
                problems.append(f"{key}: [{names[a]}][{names[b]}] != [{names[b]}][{names[a]}]")
    kt = result["parameters"].get("torque_constant", {})
    if kt.get("basis") == "equal-to-Ke" and "torque_constant" in names and "back_emf_constant" in names:
        t, e = names.index("torque_constant"), names.index("back_emf_constant")
        others = [k for k in range(len(names)) if k not in (t, e)]
        if [matrix[k][t] for k in others] != [matrix[k][e] for k in others] or not (
                matrix[t][t] == matrix[e][e] == matrix[t][e]):
            problems.append(f"{key}: torque_constant (equal to Ke) does not have Ke's row and column")
    if key == "correlation":
        problems += [f"correlation: diagonal of {n} is not 1" for k, n in enumerate(names) if matrix[k][k] != 1.0]
    return problems


def validator_for(schema_path):
    with open(schema_path) as f:
        schema = json.load(f)
    store = {}
    for path in glob.glob(os.path.join(os.path.dirname(os.path.abspath(schema_path)), "*.schema.json")):
        with open(path) as f:
            other = json.load(f)
        store[other["$id"]] = other
    resolver = jsonschema.RefResolver.from_schema(schema, store=store)
    return jsonschema.Draft202012Validator(schema, resolver=resolver)


def main():
    validator = validator_for(sys.argv[1])
    failed = False
    for path in sys.argv[2:]:
        with open(path) as f:
            result = json.load(f)
        problems = [f"{'/'.join(map(str, e.absolute_path)) or '(top)'}: {e.message}"
                    for e in validator.iter_errors(result)]
        if not problems and "covariance" in result:
            problems = matrix_problems(result, "covariance") + matrix_problems(result, "correlation")
        for p in problems:
            print(f"{path}: {p}")
        failed = failed or bool(problems)
    print(f"{len(sys.argv) - 2} result file(s) checked, {'problems found' if failed else 'all valid'}")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
