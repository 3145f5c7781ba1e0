# The pvbatch half of tools/paraview-check.sh: opens RUN/fields.xmf with ParaView's default
# reader for .xmf (the XDMF 3 one), steps through every time and checks that each one holds
# every snapshot field once, with the min/max of the values h5dump reads from fields.h5
# (the series /snapshots/FIELD, frame by frame: HDF5's own reading, not ours, not XDMF's).
#   pvbatch tools/paraview-check.py RUN
import array
import os
import subprocess
import sys
import tempfile

from paraview import servermanager
from paraview.simple import OpenDataFile

run = os.path.abspath(sys.argv[1])
h5 = os.path.join(run, "fields.h5")
tmp = tempfile.mkdtemp(prefix="terayee-pv-")
failures = []


def dump(dataset, start=None, count=None):
    """A dataset (or a hyperslab of it) as floats, through h5dump's binary output."""
    out = os.path.join(tmp, "d.bin")
    cmd = ["h5dump", "-d", dataset]  # -s and -c must follow -d
    if start:
        cmd += ["-s", ",".join(map(str, start)), "-c", ",".join(map(str, count))]
    subprocess.run(cmd + ["-b", "LE", "-o", out, h5], check=True, stdout=subprocess.DEVNULL)
    raw = open(out, "rb").read()
    n = 1
    for c in count or [0]:
        n *= c
    a = array.array("d" if not count or len(raw) == 8 * n else "f")
    a.frombytes(raw)
    return a


def blocks(data):
    it = data.NewIterator()
    it.InitTraversal()
    while not it.IsDoneWithTraversal():
        yield it.GetCurrentDataObject()
        it.GoToNextItem()


times = list(dump("/snapshots/time"))
reader = OpenDataFile(os.path.join(run, "fields.xmf"))
if not reader.GetXMLName().startswith("Xdmf3"):
    failures.append("the default reader is %s, not the XDMF 3 one" % reader.GetXMLName())
pv_times = list(reader.TimestepValues) if len(times) > 1 else [reader.TimestepValues]
if len(pv_times) != len(times) or any(abs(a - b) > 1e-9 * abs(b) for a, b in zip(pv_times, times)):
    failures.append("ParaView's times %s are not /snapshots/time %s" % (pv_times, times))
fields = None
checked = 0
for k, t in enumerate(pv_times[: len(times)]):
    reader.UpdatePipeline(t)
    seen = {}
    for b in blocks(servermanager.Fetch(reader)):
        pd = b.GetPointData()
        for i in range(pd.GetNumberOfArrays()):
            name = pd.GetArrayName(i).split(" ")[0]
            nx, ny, _ = b.GetDimensions()
            lo, hi = pd.GetArray(i).GetRange()
            ref = dump("/snapshots/" + name, (k, 0, 0), (1, ny, nx))
            if len(ref) != nx * ny:
                failures.append("t=%g %s: %d values in HDF5, a %dx%d grid in ParaView" % (t, name, len(ref), nx, ny))
            elif (lo, hi) != (min(ref), max(ref)):
                failures.append("t=%g %s: range %g..%g in ParaView, %g..%g in fields.h5 frame %d"
                                % (t, name, lo, hi, min(ref), max(ref), k))
            seen[name] = seen.get(name, 0) + 1
            checked += 1
    fields = fields or sorted(seen)
    if sorted(seen) != fields or any(v != 1 for v in seen.values()) or not seen:
        failures.append("t=%g holds %s, not every field once (%s)" % (t, seen, fields))
for f in failures:
    print("paraview-check: " + f)
print("paraview-check: %s: %d times, fields %s, %d ranges compared: %s"
      % (run, len(pv_times), fields, checked, "FAILED" if failures else "ok"))
sys.exit(1 if failures else 0)
