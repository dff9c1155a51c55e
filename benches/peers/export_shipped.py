"""Write membership_regions_shipped.json: the shipped QFL and QmFLt field sets, as exported by
`sandprov fields show ID --format json`, in the layout of membership_regions.json.

Usage: python export_shipped.py PATH/TO/sandprov
(The shipped vertices are transcribed from memory, approximate; here they only set the work.)
"""
import json
import subprocess
import sys

exe = sys.argv[1]
out = {"note": "The shipped dickinson1985-qfl and dickinson1985-qmflt field sets (vertices from memory, approximate), exported for the benchmark.", "diagrams": []}
for set_id in ["dickinson1985-qfl", "dickinson1985-qmflt"]:
    s = json.loads(subprocess.run([exe, "fields", "show", set_id, "--format", "json"], check=True, capture_output=True, text=True).stdout)
    out["diagrams"].append({"id": s["diagram"], "regions": [{"name": f["name"], "vertices": f["vertices"]} for f in s["fields"]]})
json.dump(out, open("membership_regions_shipped.json", "w"), indent=1)
