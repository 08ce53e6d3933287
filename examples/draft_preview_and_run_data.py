#!/usr/bin/env python3
"""A draft recipe, its preview and a run's data through the Brothwright API, in Python.

Standard library only. Needs BROTHWRIGHT_TOKEN (see README.md); BROTHWRIGHT_URL defaults to the
local demo. Stops at the first refusal and prints its problem details.
"""
import json
import os
import sys
import time
import urllib.error
import urllib.request
from datetime import datetime, timezone

URL = os.environ.get("BROTHWRIGHT_URL", "http://127.0.0.1:3000").rstrip("/")
TOKEN = os.environ.get("BROTHWRIGHT_TOKEN")


class Refused(Exception):
    """A problem+json answer: status, detail and the fields it names."""

    def __init__(self, status, problem):
        self.status = status
        self.problem = problem
        errors = "".join(
            f"\n  {e.get('path')}: {e.get('message')}" for e in problem.get("errors") or []
        )
        super().__init__(f"{status} {problem.get('detail', '')}{errors}")


def call(method, path, body=None, content_type="application/json", headers=None, retries=3):
    """One request with the token; returns (body as JSON, response headers)."""
    data = None
    sent = {"Authorization": f"Bearer {TOKEN}", "Accept": "application/json"}
    if body is not None:
        data = body.encode() if isinstance(body, str) else json.dumps(body).encode()
        sent["Content-Type"] = content_type
    sent.update(headers or {})
    request = urllib.request.Request(URL + path, data=data, method=method, headers=sent)
    try:
        with urllib.request.urlopen(request) as response:
            return json.loads(response.read() or b"null"), response.headers
    except urllib.error.HTTPError as error:
        problem = json.loads(error.read() or b"{}")
        if error.code == 429 and retries > 0:
            wait_s = int(error.headers.get("Retry-After", "1"))
            print(f"   (rate limit: waiting {wait_s} s as Retry-After says)")
            time.sleep(wait_s)
            return call(method, path, body, content_type, headers, retries - 1)
        raise Refused(error.code, problem) from None


def path_of(location):
    """The path of a Location header, whether it names the host or not."""
    return "/" + location.split("://", 1)[-1].split("/", 1)[-1] if "://" in location else location


def main():
    if not TOKEN:
        sys.exit("Set BROTHWRIGHT_TOKEN to a token made under Account → API tokens.")

    me, _ = call("GET", "/api/v1/me")
    print(f"== acting as {me['name']} ({', '.join(me['roles'])}) with token “{me['token']['name']}”")

    for component_id in ("d-glucose", "sodium-chloride", "potassium-dihydrogen-phosphate"):
        component, _ = call("GET", f"/api/v1/components/{component_id}")
        print(f"   uses {component['name']}")

    name = f"Example basal medium {datetime.now():%Y%m%d-%H%M%S} (py)"
    lines = [
        {"componentId": "d-glucose", "amount": 10, "unit": "g/L"},
        {"componentId": "sodium-chloride", "amount": 5, "unit": "g/L"},
    ]
    _, headers = call(
        "POST", "/api/v1/recipes", {"name": name, "kind": "basal", "targetPh": 7.0, "lines": lines}
    )
    version_path = path_of(headers["Location"])
    print(f"== created {version_path} at ETag {headers['ETag']}")

    lines.append({"componentId": "potassium-dihydrogen-phosphate", "amount": 2, "unit": "g/L"})
    _, headers = call(
        "PUT", f"{version_path}/lines", {"lines": lines}, headers={"If-Match": headers["ETag"]}
    )
    print(f"== lines replaced; now at ETag {headers['ETag']}")

    preview, _ = call("POST", "/api/v1/recipes/preview", {"lines": lines})
    osmolality = preview["osmolality"]["estimateMOsmPerKg"]
    print(f"== preview: about {osmolality:.0f} mOsm/kg, {len(preview['warnings'])} warning(s)")

    studies, _ = call("GET", "/api/v1/studies?limit=1")
    study = studies["items"][0]
    started = datetime.now(timezone.utc).strftime("%Y-%m-%dT%H:%M")
    created, _ = call(
        "POST", "/api/v1/runs", {"name": name, "studyId": study["id"], "startedAt": started}
    )
    run_id = created["run"]["id"]
    print(f"== run {created['run']['number']} of study “{study['name']}”")

    points = [
        {"time_h": 0, "do_percent": 98.5, "dry_weight_g_per_l": 0.21},
        {"time_h": 0.5, "do_percent": 97.9},
    ]
    first, _ = call("POST", f"/api/v1/runs/{run_id}/data", {"points": points})
    csv = "time_h,do_percent,exhaust_o2_percent\n1,96.8,20.81\n1.5,95.2,20.74\n"
    from_csv, _ = call("POST", f"/api/v1/runs/{run_id}/data", csv, content_type="text/csv")
    again, _ = call("POST", f"/api/v1/runs/{run_id}/data", {"points": points})
    print(f"== data: {first} then CSV {from_csv}; the same points again: {again}")
    print("done")


if __name__ == "__main__":
    try:
        main()
    except Refused as refusal:
        sys.exit(f"refused: {refusal}")
