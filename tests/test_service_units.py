"""The service's parts in isolation: sizes, tokens, links, callback hosts, the job store."""

from __future__ import annotations

import sqlite3
import time

import pytest

from ifccheck.service.auth import (
    LinkSigner,
    TokenVerifier,
    create_token,
    parse_token,
    service_key,
)
from ifccheck.service.jobs import one_line
from ifccheck.service.settings import parse_size
from ifccheck.service.store import Store
from ifccheck.service.uploads import model_file_name
from ifccheck.service.webhooks import check_callback_url


def test_sizes():
    assert parse_size("1GiB") == 1 << 30
    assert parse_size("500 MB") == 500_000_000
    assert parse_size("2048") == 2048
    assert parse_size("1.5KiB") == 1536
    for bad in ("", "12 parsecs", "-1", "0", "MB"):
        with pytest.raises(ValueError):
            parse_size(bad)


def test_token_stored_only_as_salted_hash(tmp_path):
    store = Store(tmp_path)
    token = create_token(store, "alice")
    token_id, secret = parse_token(token)
    raw = sqlite3.connect(tmp_path / "ifccheck.sqlite3").execute("SELECT * FROM tokens").fetchall()
    assert len(raw) == 1
    assert all(secret not in str(v) and token not in str(v) for v in raw[0])
    second = create_token(store, "bob")
    a, b = store.token(token_id), store.token(parse_token(second)[0])
    assert a.salt != b.salt and len(a.salt) == 16
    with pytest.raises(ValueError, match="already exists"):
        create_token(store, "alice")


def test_verify_and_revoke(tmp_path):
    store = Store(tmp_path)
    token = create_token(store, "alice")
    verifier = TokenVerifier(store)
    token_id = parse_token(token)[0]
    assert verifier.verify(token) == token_id
    assert verifier.verify(token) == token_id  # remembered, and still checked for revocation
    wrong = token[:-4] + ("AAAA" if not token.endswith("AAAA") else "BBBB")
    assert verifier.verify(wrong) is None
    assert verifier.verify("not a token") is None
    assert verifier.verify(f"ifck_{'0' * 12}_{'a' * 43}") is None
    assert store.revoke_tokens("alice") == 1
    assert verifier.verify(token) is None
    assert store.revoke_tokens("alice") == 0
    create_token(store, "alice")  # the name is free again once revoked


def test_signed_links(tmp_path):
    key = service_key(tmp_path)
    assert service_key(tmp_path) == key  # made once per data directory
    assert (tmp_path / "service.key").stat().st_mode & 0o077 == 0
    signer = LinkSigner(key, ttl=60)
    expires, sig = signer.sign("t1", "j1", "report.html")
    assert signer.check("t1", "j1", "report.html", expires, sig)
    assert not signer.check("t2", "j1", "report.html", expires, sig)
    assert not signer.check("t1", "j1", "results.json", expires, sig)
    assert not signer.check("t1", "j1", "report.html", expires + 1, sig)
    stale = LinkSigner(key, ttl=-1)
    expires, sig = stale.sign("t1", "j1", "report.html")
    assert expires < time.time() and not stale.check("t1", "j1", "report.html", expires, sig)


def test_callback_hosts():
    allowed = ("hooks.example.org", "127.0.0.1:9000", "[::1]:7000")
    assert check_callback_url("https://hooks.example.org/ifc", allowed) is None
    assert check_callback_url("http://127.0.0.1:9000/x", allowed) is None
    assert check_callback_url("http://[::1]:7000/x", allowed) is None
    assert "not among" in check_callback_url("http://127.0.0.1:9001/x", allowed)
    assert "not among" in check_callback_url("https://evil.example.org/", allowed)
    assert "not among" in check_callback_url("https://hooks.example.org.evil.net/", allowed)
    assert "http" in check_callback_url("file:///etc/passwd", allowed)
    assert "user" in check_callback_url("https://u:p@hooks.example.org/", allowed)
    assert "allows no callback hosts" in check_callback_url("https://hooks.example.org/", ())


def test_model_file_names():
    assert model_file_name("quillfeather-rev-a.ifc") == "quillfeather-rev-a.ifc"
    assert model_file_name("../../etc/passwd") == "passwd.ifc"
    assert model_file_name("C:\\models\\Tower B.IFC") == "Tower_B.IFC"
    assert model_file_name("..") == "model.ifc"
    assert model_file_name("") == "model.ifc"


def test_one_line_messages():
    from ifccheck.errors import ModelError

    class LookAlike(Exception):  # errors are told apart by class, never by name
        pass

    assert one_line(LookAlike("x")) == "internal error: LookAlike: x"
    assert one_line(
        ModelError("/srv/d/jobs/x/input/a.ifc: truncated\nmore"), "/srv/d/jobs/x/input"
    ) == ("a.ifc: truncated more")
    assert one_line(KeyError("k")) == "internal error: KeyError: 'k'"


def _add(store: Store, job_id: str, token: str, key: str | None) -> None:
    store.add_job(job_id, token, key, "m.ifc", None, None, None, None)


def test_revisions_of_one_model_run_in_order(tmp_path):
    """A revision waits for the earlier ones of its model; other models do not wait."""
    store = Store(tmp_path)
    _add(store, "a1", "t", "tower")
    _add(store, "a2", "t", "tower")
    _add(store, "b1", "t", "annex")
    _add(store, "c1", "t", None)
    _add(store, "o1", "other", "tower")  # another token's model of the same name
    assert [j.id for j in store.eligible(10)] == ["a1", "b1", "c1", "o1"]
    store.mark_checking("a1")
    assert [j.id for j in store.eligible(10)] == ["b1", "c1", "o1"]
    store.mark_finished("a1", {"summary": {}, "files": []})
    assert [j.id for j in store.eligible(10)] == ["a2", "b1", "c1", "o1"]
    a2 = store.job("a2")
    assert store.previous_finished(a2).id == "a1"
    assert store.previous_finished(store.job("o1")) is None
    assert store.job("a2", "other") is None  # another token's job is not found
    assert [j.id for j in store.jobs("t", "tower")] == ["a2", "a1"]
    assert [j.id for j in store.jobs("t")] == ["c1", "b1", "a2", "a1"]


class _Recorder:
    """A runner that only records what it is given (the dispatcher's side is under test)."""

    name = "recorder"

    def __init__(self) -> None:
        self.specs = []

    def start(self) -> None:
        pass

    def capacity(self) -> int:
        return 4

    def submit(self, spec, done) -> None:
        self.specs.append(spec)

    def stop(self) -> None:
        pass


def _wait_until(predicate, timeout: float = 10.0) -> bool:
    deadline = time.monotonic() + timeout
    while time.monotonic() < deadline:
        if predicate():
            return True
        time.sleep(0.02)
    return False


def test_restart_takes_up_interrupted_jobs(tmp_path):
    """Checking jobs: complete files → finished without a re-run; otherwise received again."""
    from ifccheck.service.core import Service
    from ifccheck.service.settings import ServiceConfig

    store = Store(tmp_path)
    for job_id in ("finished", "cut-off", "waiting"):
        _add(store, job_id, "t", None)
        (tmp_path / "jobs" / job_id / "input").mkdir(parents=True)
    store.mark_checking("finished")
    store.mark_checking("cut-off")
    out = tmp_path / "jobs" / "finished" / "out"
    out.mkdir()
    (out / "outcome.json").write_text('{"summary": {"pass": 1}, "files": ["results.json"]}')
    (out / "results.json").write_text("{}")
    (tmp_path / "jobs" / "cut-off" / "tmp-0123").mkdir()  # a half-written attempt
    store.close()

    runner = _Recorder()
    service = Service(ServiceConfig(data_dir=tmp_path), runner)
    service.start()
    try:
        assert _wait_until(lambda: len(runner.specs) == 2)
        assert sorted(s.job_id for s in runner.specs) == ["cut-off", "waiting"]
        done = service.store.job("finished")
        assert done.status == "finished" and service.status(done)["summary"] == {"pass": 1}
        assert service.store.job("waiting").status == "checking"  # handed to the runner
        assert service.store.job("cut-off").attempts == 2
        assert not (tmp_path / "jobs" / "cut-off" / "tmp-0123").exists()
        spec = next(s for s in runner.specs if s.job_id == "cut-off")
        service._finished(spec, None, "the check failed: reason")
        assert service.store.job("cut-off").error == "the check failed: reason"
    finally:
        service.stop()


def test_token_commands(tmp_path):
    from click.testing import CliRunner

    from ifccheck.cli import main

    runner = CliRunner()
    data = str(tmp_path / "d")
    made = runner.invoke(main, ["token", "create", "ci", "--data", data])
    assert made.exit_code == 0
    assert parse_token(made.output.strip().splitlines()[-1]) is not None
    assert "ci\t" in runner.invoke(main, ["token", "list", "--data", data]).output
    again = runner.invoke(main, ["token", "create", "ci", "--data", data])
    assert again.exit_code == 2 and "already exists" in again.output
    assert runner.invoke(main, ["token", "revoke", "ci", "--data", data]).exit_code == 0
    gone = runner.invoke(main, ["token", "revoke", "ci", "--data", data])
    assert gone.exit_code == 2 and "no active token" in gone.output
    bad = runner.invoke(main, ["serve", "--max-upload", "lots", "--data", data])
    assert bad.exit_code == 2 and "not a size" in bad.output


def test_a_database_of_schema_1_takes_the_new_state_names(tmp_path):
    """States queued/running/done/failed of schema version 1 become received/checking/..."""
    import sqlite3

    store = Store(tmp_path)
    for job_id in ("q", "r", "d", "f"):
        _add(store, job_id, "t", None)
    store.close()
    db = sqlite3.connect(tmp_path / "ifccheck.sqlite3")
    for job_id, old in (("q", "queued"), ("r", "running"), ("d", "done"), ("f", "failed")):
        db.execute("UPDATE jobs SET status = ? WHERE id = ?", (old, job_id))
    db.execute("PRAGMA user_version=1")
    db.commit()
    db.close()
    store = Store(tmp_path)
    try:
        states = {j: store.job(j).status for j in ("q", "r", "d", "f")}
        assert states == {"q": "received", "r": "checking", "d": "finished", "f": "errored"}
        assert store.counts() == {"received": 1, "checking": 1, "finished": 1, "errored": 1}
    finally:
        store.close()
