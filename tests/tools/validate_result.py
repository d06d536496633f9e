#!/usr/bin/env python3
"""Checks coilspin result files against docs/result-format-2.schema.json.

Usage: validate_result.py SCHEMA RESULT.json [RESULT.json ...]

Besides the schema (python3-jsonschema, Debian), checks what JSON Schema cannot
say: the covariance and correlation are square, one row per name, symmetric
exactly; their names are parameters; a torque constant taken equal to Ke has
Ke's row; the correlation has 1 on its diagonal. Prints one line per problem
and exits 1 when there is any.
"""
import json
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


def main():
    with open(sys.argv[1]) as f:
        schema = json.load(f)
    validator = jsonschema.Draft202012Validator(schema)
    failed = False
    for path in sys.argv[2:]:
        with open(path) as f:
            result = json.load(f)
        problems = [f"{'/'.join(map(str, e.absolute_path)) or '(top)'}: {e.message}"
                    for e in validator.iter_errors(result)]
        if not problems:
            problems = matrix_problems(result, "covariance") + matrix_problems(result, "correlation")
        for p in problems:
            print(f"{path}: {p}")
        failed = failed or bool(problems)
    print(f"{len(sys.argv) - 2} result file(s) checked, {'problems found' if failed else 'all valid'}")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
