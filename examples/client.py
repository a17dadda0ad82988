#!/usr/bin/env python3
"""Platesmith's HTTP API from Python, standard library only: a script to adapt.

It searches one girder (searchGirders) and prints its Pareto table, then submits a schedule
(submitSchedule), follows its progress on the event stream (followSchedule) and prints each
mark's Pareto table from the result (getScheduleResult). The operation names are the
operationIds of the API's OpenAPI document (/openapi.json).

    pnpm platesmith serve                   # in another terminal: the service on 127.0.0.1:8080
    python3 examples/client.py              # girder KQ-G1 of demo/kestrel-quay.json, then demo/schedule-harbour-sheds.json
    python3 examples/client.py --url http://127.0.0.1:8080 --search my-girder.json --schedule my-schedule.json

Units as in the API: lengths mm, forces kN, loads kN/m, moments kNm, stresses MPa, mass kg.
Results are a design aid: they must be checked by a competent engineer against the governing
code and its national annex before use (the service's own caution is printed at the end).
"""
import argparse
import json
import os
import sys
import time
import urllib.error
import urllib.request

HERE = os.path.dirname(os.path.abspath(__file__))
DEMO = os.path.join(HERE, "..", "demo")


class ApiError(Exception):
    """An answer of 400 or more: the service's problem details (RFC 9457)."""

    def __init__(self, status, problem):
        self.status = status
        self.problem = problem
        fields = "; ".join(f"{e['path']}: {e['message']}" for e in problem.get("errors", []))
        hint = f"\nhint: {problem['hint']}" if problem.get("hint") else ""
        super().__init__(f"{status} {problem.get('code')}: {problem.get('detail')}" + (f" ({fields})" if fields else "") + hint)


class Client:
    def __init__(self, url, token=None, retries=5):
        self.url = url.rstrip("/")
        self.token = token
        self.retries = retries

    def _request(self, method, path, body=None, accept="application/json"):
        headers = {"accept": accept}
        if body is not None:
            headers["content-type"] = "application/json"
        if self.token:
            headers["authorization"] = f"Bearer {self.token}"
        data = json.dumps(body).encode() if body is not None else None
        return urllib.request.Request(self.url + path, data=data, headers=headers, method=method)

    def call(self, method, path, body=None):
        """JSON in, JSON out; a 503 or 429 is retried after its Retry-After, any other error raises ApiError."""
        for attempt in range(self.retries + 1):
            try:
                with urllib.request.urlopen(self._request(method, path, body)) as r:
                    text = r.read().decode()
                    return json.loads(text) if text else None
            except urllib.error.HTTPError as e:
                text = e.read().decode()
                problem = json.loads(text) if text.startswith("{") else {"detail": text}
                wait = e.headers.get("retry-after")
                if e.code in (429, 503) and wait is not None and attempt < self.retries:
                    print(f"  {e.code} {problem.get('code')}: retrying in {wait} s", file=sys.stderr)
                    time.sleep(float(wait))
                    continue
                raise ApiError(e.code, problem) from None
        raise AssertionError("unreachable")

    def events(self, path):
        """The Server-Sent Events of a path, as (event, data) pairs, until the stream ends."""
        with urllib.request.urlopen(self._request("GET", path, accept="text/event-stream")) as r:
            event, data = None, []
            for raw in r:
                line = raw.decode().rstrip("\r\n")
                if line == "":
                    if event or data:
                        yield event, json.loads("\n".join(data)) if data else None
                    event, data = None, []
                elif line.startswith("event:"):
                    event = line[6:].strip()
                elif line.startswith("data:"):
                    data.append(line[5:].strip())

    # the API's operations used here, named by their operationId
    def search_girders(self, problem):
        return self.call("POST", "/v1/searches", problem)

    def submit_schedule(self, schedule):
        return self.call("POST", "/v1/schedules", schedule)

    def follow_schedule(self, job):
        return self.events(job["links"]["events"])

    def get_schedule_result(self, job):
        return self.call("GET", job["links"]["result"])


def section_text(s):
    web, top, bot = s["web"], s["topFlange"], s["bottomFlange"]
    flanges = f"fl {top['width']}x{top['thickness']}" + ("" if top == bot else f" / {bot['width']}x{bot['thickness']}")
    stiff = f"stiff @{s['stiffeners']['spacing']}" if s.get("stiffeners") else "no stiff"
    return f"web {web['depth']}x{web['thickness']}, {flanges}, {stiff}, {s['grade']}"


def print_pareto(title, result):
    print(f"\n{title}")
    if result.get("status") not in (None, "exact"):
        print(f"  status {result['status']}: {result.get('message', '')}")
    if not result["pareto"]:
        print("  no feasible section; nearest misses:")
        for m in result.get("nearMisses", []):
            print(f"    {m['depth']} mm, {m['mass']:.1f} kg, {section_text(m['section'])}: fails {', '.join(m['failing'])}")
        return
    print(f"  {'depth mm':>8}  {'mass kg':>9}  {'kg/m':>6}  {'governing check':<27} {'util.':>5}  section")
    for p in result["pareto"]:
        g = p["governing"]
        print(f"  {p['depth']:>8}  {p['mass']:>9.1f}  {p['massPerMetre']:>6.1f}  {g['id']:<27} {g['utilisation']:>5.3f}  {section_text(p['section'])}")


def demo_girder(mark="KQ-G1"):
    """A girder of the demo project as a search request: the defaults, then its own fields."""
    with open(os.path.join(DEMO, "kestrel-quay.json")) as f:
        demo = json.load(f)
    girder = next(g for g in demo["girders"] if g["mark"] == mark)
    fields = {k: v for k, v in girder.items() if k not in ("mark", "description")}
    return {**demo["defaults"], **fields, "options": {**demo["defaults"].get("options", {}), **fields.get("options", {})}}


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--url", default=os.environ.get("PLATESMITH_URL", "http://127.0.0.1:8080"))
    ap.add_argument("--token", default=os.environ.get("PLATESMITH_TOKEN"), help="bearer key, where the service has keys")
    ap.add_argument("--search", help="a search request (JSON); default: girder KQ-G1 of the demo project")
    ap.add_argument("--schedule", default=os.path.join(DEMO, "schedule-harbour-sheds.json"), help="a schedule (JSON)")
    args = ap.parse_args()
    api = Client(args.url, args.token)

    try:
        if args.search:
            with open(args.search) as f:
                problem = json.load(f)
        else:
            problem = demo_girder()
        found = api.search_girders(problem)
        print_pareto(f"Search: {args.search or 'KQ-G1 of demo/kestrel-quay.json'} "
                     f"({found['stats']['spaceSize']:.3g} candidates, {found['stats']['fullEvaluations']} judged in full)", found)

        with open(args.schedule) as f:
            schedule = json.load(f)
        job = api.submit_schedule(schedule)
        print(f"\nSchedule job {job['id']} ({job['marks']} marks) {job['status']}")
        for event, status in api.follow_schedule(job):
            p = status.get("progress") or {}
            print(f"  {event}: {status['status']}, {p.get('marksDone', 0)}/{p.get('marksTotal', job['marks'])} marks")
            job = status
        if job["status"] != "done":
            print(f"the job ended {job['status']}: {job.get('error')}", file=sys.stderr)
            return 1
        result = api.get_schedule_result(job)
        for m in result["marks"]:
            if m["search"]:
                print_pareto(f"Mark {m['mark']} (x{m['quantity']})", m["search"])
            else:
                print(f"\nMark {m['mark']}: {m['status']} {m.get('error', '')}")
        t = result["totals"]
        print(f"\n{t['girders']} girders, {t['tonnage']:.2f} t at the lightest section of each mark")
        print(f"\n{found['caution']}\n{found['scope']}")
        return 0
    except ApiError as e:
        print(f"error: {e}", file=sys.stderr)
        return 2
    except urllib.error.URLError as e:
        print(f"error: cannot reach {args.url} ({e.reason}); start the service with: pnpm platesmith serve", file=sys.stderr)
        return 2


if __name__ == "__main__":
    sys.exit(main())
