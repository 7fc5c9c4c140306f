"""A lapwright client using only the Python standard library (urllib, json).

Drop this file into a training script: it has no dependencies. 503 (busy) and 429 (rate
limited) answers are retried after their Retry-After header, a few times; every other error
raises LapwrightError with the service's code, message and issues. A server with an API token
gets it from the token argument or the LAPWRIGHT_API_TOKEN environment variable.

    python3 examples/client.py [--url http://127.0.0.1:8080]

fetches the presets and one track of each (the Larkspur sim team's nightly curriculum).
Generated layouts are for simulation and games only.
"""

import argparse
import json
import os
import sys
import time
import urllib.error
import urllib.parse
import urllib.request


class LapwrightError(Exception):
    """An error answer of the service; `code` is stable (ERR_INVALID_PARAMS, ERR_INFEASIBLE, ...)."""

    def __init__(self, status, body):
        self.status = status
        self.code = body.get("code", "HTTP_%d" % status)
        self.message = body.get("message", "")
        self.issues = body.get("issues", [])
        self.reason = body.get("reason")
        self.hint = body.get("hint")
        text = "%d %s: %s" % (status, self.code, self.message)
        if self.hint:
            text += " (hint: %s)" % self.hint
        super().__init__(text)


class LapwrightClient:
    """Talks to one lapwright service.

    >>> client = LapwrightClient("http://127.0.0.1:8080")
    >>> track = client.track({"seed": "larkspur-heldout-0042", "lengthM": 3000})
    """

    def __init__(self, base_url="http://127.0.0.1:8080", retries=5, timeout_s=60.0, token=None):
        self.base = base_url.rstrip("/")
        self.retries = retries
        self.timeout_s = timeout_s
        # API token of a server that requires one (default: the LAPWRIGHT_API_TOKEN variable)
        self.token = token if token is not None else (os.environ.get("LAPWRIGHT_API_TOKEN") or None)

    def health(self):
        """GET /healthz: {status, version, generatorVersion}."""
        return self._json("GET", "/healthz")

    def presets(self):
        """GET /v1/presets: the named difficulty presets, easiest first."""
        return self._json("GET", "/v1/presets")["presets"]

    def track(self, params=None):
        """POST /v1/tracks: one track as a dict. A seed left out is drawn and echoed in track["seed"]."""
        return self._json("POST", "/v1/tracks", params or {})

    def track_by_seed(self, seed, params=None):
        """GET /v1/tracks/{seed}: the same track, by a URL that caches and proxies can keep."""
        query = urllib.parse.urlencode(_flatten(params or {}))
        path = "/v1/tracks/" + urllib.parse.quote(str(seed), safe="")
        return self._json("GET", path + ("?" + query if query else ""))

    def validate(self, track):
        """POST /v1/tracks/validate: {valid, issues} for a track dict."""
        return self._json("POST", "/v1/tracks/validate", track)

    def _json(self, method, path, body=None):
        data = None if body is None else json.dumps(body).encode("utf-8")
        headers = {"Accept": "application/json"}
        if data is not None:
            headers["Content-Type"] = "application/json"
        if self.token:
            headers["Authorization"] = "Bearer " + self.token
        attempt = 0
        while True:
            request = urllib.request.Request(self.base + path, data=data, headers=headers, method=method)
            try:
                with urllib.request.urlopen(request, timeout=self.timeout_s) as response:
                    return json.loads(response.read().decode("utf-8"))
            except urllib.error.HTTPError as err:
                text = err.read().decode("utf-8", "replace")
                # 503: the service is busy; 429: this client is over the rate limit
                if err.code in (503, 429) and attempt < self.retries:
                    # the service says when to come back; wait at least that, a little more each time
                    try:
                        after = float(err.headers.get("Retry-After", "1"))
                    except ValueError:
                        after = 1.0
                    time.sleep(after * (1 + attempt / 2))
                    attempt += 1
                    continue
                try:
                    parsed = json.loads(text)
                except ValueError:
                    parsed = {"message": text[:200]}
                raise LapwrightError(err.code, parsed) from None


def _flatten(params, prefix=""):
    """Nested parameters as dotted query keys: {"widthM": {"min": 8}} -> [("widthM.min", "8")]."""
    out = []
    for key, value in params.items():
        if isinstance(value, dict):
            out.extend(_flatten(value, prefix + key + "."))
        elif value is not None:
            out.append((prefix + key, json.dumps(value) if isinstance(value, bool) else str(value)))
    return out


def _demo(base_url):
    client = LapwrightClient(base_url)
    health = client.health()
    print("lapwright %s (generator %s) at %s" % (health["version"], health["generatorVersion"], base_url))
    for preset in client.presets():
        params = dict(preset["params"], seed="larkspur-night-1202-" + preset["name"])
        track = client.track(params)
        metrics = track["metrics"]
        print("%-10s %5.0f m, %2d corners, %3d gates, difficulty %.2f, id %s" % (
            preset["name"], metrics["lengthM"], metrics["cornerCount"], len(track["gates"]), metrics["difficulty"], track["id"][:12]))
    same = client.track_by_seed("larkspur-night-1202-gentle", client.presets()[0]["params"])
    print("GET by seed gives the same track: %s" % (same["id"] == client.track(dict(client.presets()[0]["params"], seed="larkspur-night-1202-gentle"))["id"]))
    print("validate: %s" % client.validate(same)["valid"])
    try:
        client.track({"turnBalance": 0, "curvatureBudgetDeg": 900})
    except LapwrightError as err:
        print("refused as expected: %s (%s): %s" % (err.code, err.reason, err.hint))


if __name__ == "__main__":
    parser = argparse.ArgumentParser(description="Fetch one track of each lapwright preset.")
    parser.add_argument("--url", default=os.environ.get("LAPWRIGHT_URL", "http://127.0.0.1:8080"))
    try:
        _demo(parser.parse_args().url)
    except (LapwrightError, urllib.error.URLError) as err:
        print(err, file=sys.stderr)
        sys.exit(1)
