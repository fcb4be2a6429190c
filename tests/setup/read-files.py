"""Independent readers for the export tests: legacy VTK through meshio (Debian's python3-meshio) and ZIP through
Python's zipfile. Prints JSON; arrays travel as base64 of little-endian doubles (JSON has no NaN)."""
import base64
import json
import sys
import zipfile

import numpy as np


def b64(a):
    return base64.b64encode(np.ascontiguousarray(np.asarray(a, dtype='<f8').ravel()).tobytes()).decode()


def vtk(path):
    import meshio

    m = meshio.read(path)
    return {
        'points': b64(m.points),
        'cells': [[c.type, len(c.data)] for c in m.cells],
        'cell_data': {k: b64(v[0]) for k, v in m.cell_data.items()},
        'point_data': {k: b64(v) for k, v in m.point_data.items()},
    }


def zip_entries(path):
    with zipfile.ZipFile(path) as z:
        bad = z.testzip()
        return {'ok': bad is None, 'names': z.namelist(), 'texts': {n: z.read(n).decode('utf-8') for n in z.namelist() if not n.endswith('.vtk')}}


if __name__ == '__main__':
    kind, path = sys.argv[1], sys.argv[2]
    print(json.dumps(vtk(path) if kind == 'vtk' else zip_entries(path)))
