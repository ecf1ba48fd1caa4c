"""`ifccheck serve` and `ifccheck token create/revoke/list`: the HTTP service's commands."""

from __future__ import annotations

import ipaddress
import os
import socket
from pathlib import Path

import click

from ifccheck import CAUTION
from ifccheck.errors import UsageError
from ifccheck.service.settings import (
    DEFAULT_JOB_TIMEOUT,
    DEFAULT_WORKERS,
    ServiceConfig,
    parse_size,
)

DEFAULT_DATA = "ifccheck-data"


def _data_option(f):
    return click.option(
        "--data",
        "data_dir",
        default=DEFAULT_DATA,
        show_default=True,
        type=click.Path(file_okay=False),
        help="The service's data directory (database and job files).",
    )(f)


def _size(ctx, param, value: str) -> int:
    try:
        return parse_size(value)
    except ValueError as exc:
        raise click.BadParameter(str(exc)) from None


def _loopback(host: str) -> bool:
    if host == "localhost":
        return True
    try:
        return ipaddress.ip_address(host.strip("[]")).is_loopback
    except ValueError:
        return False


@click.command()
@click.option("--host", default="127.0.0.1", show_default=True, help="Address to listen on.")
@click.option("--port", default=8080, show_default=True, type=click.IntRange(0, 65535))
@_data_option
@click.option("--workers", default=DEFAULT_WORKERS, show_default=True, type=click.IntRange(1, 512),
              help="Worker processes: how many checks run at once.")  # fmt: skip
@click.option("--max-upload", default="1GiB", show_default=True, callback=_size,
              help="Largest upload (all its files together), e.g. 1GiB, 200MB.")  # fmt: skip
@click.option("--job-timeout", default=DEFAULT_JOB_TIMEOUT, show_default=True,
              type=click.FloatRange(min=1), help="Time limit of one check, seconds.")  # fmt: skip
@click.option("--allow-callback-host", "callback_hosts", multiple=True, metavar="HOST[:PORT]",
              help="A host that callback_url webhooks may be sent to (repeat for more). "
              "Without any, webhooks are refused.")  # fmt: skip
@click.option("--callback-timeout", default=10.0, show_default=True,
              type=click.FloatRange(min=0.1),
              help="Timeout of one webhook attempt, seconds.")  # fmt: skip
@click.option("--callback-retries", default=3, show_default=True, type=click.IntRange(0, 10),
              help="Further webhook attempts after a failed one.")  # fmt: skip
@click.option("--scheduler", metavar="ADDRESS", default=None,
              help="Run checks on a Dask distributed cluster (e.g. tcp://10.0.0.5:8786) "
              "instead of local workers; its workers must see --data at the same "
              "path.")  # fmt: skip
@click.option("--log-level", default="info", show_default=True,
              type=click.Choice(["critical", "error", "warning", "info", "debug"]))  # fmt: skip
def serve(
    host: str,
    port: int,
    data_dir: str,
    workers: int,
    max_upload: int,
    job_timeout: float,
    callback_hosts: tuple[str, ...],
    callback_timeout: float,
    callback_retries: int,
    scheduler: str | None,
    log_level: str,
) -> None:
    """Run the check as an HTTP service (API under /api/v1, web page at /).

    Make a token first with `ifccheck token create NAME`. Jobs and files
    persist under --data; jobs cut off by a stop run again at the next start.
    """
    import uvicorn

    from ifccheck.service.app import create_app

    data = usable_data_dir(Path(data_dir))
    if scheduler:
        try:
            import distributed  # noqa: F401
        except ImportError:
            raise UsageError("--scheduler needs the 'distributed' package") from None
    config = ServiceConfig(
        data_dir=data,
        workers=workers,
        max_upload=max_upload,
        job_timeout=job_timeout,
        callback_hosts=callback_hosts,
        callback_timeout=callback_timeout,
        callback_retries=callback_retries,
        scheduler=scheduler,
    )
    sock = listening_socket(host, port)
    if not _loopback(host):
        click.echo(
            f"warning: listening on {host}: tokens cross the network in the clear; "
            "put a TLS reverse proxy in front of the service",
            err=True,
        )
    real_port = sock.getsockname()[1]  # the port the system chose, for --port 0
    runner = f"Dask scheduler {scheduler}" if scheduler else f"{workers} local worker(s)"
    shown = f"[{host.strip('[]')}]" if ":" in host else host
    click.echo(
        f"ifccheck service on http://{shown}:{real_port}/ — data in {data}, {runner}",
        err=True,
    )
    click.echo(CAUTION, err=True)
    server = uvicorn.Server(
        uvicorn.Config(
            create_app(config),
            host=host,
            port=real_port,
            log_level=log_level,
            timeout_graceful_shutdown=5,
            server_header=False,
        )
    )
    try:
        server.run(sockets=[sock])
    finally:
        sock.close()


def usable_data_dir(path: Path) -> Path:
    """The data directory, made if need be; UsageError (one line) when it cannot be used."""
    import sqlite3

    from ifccheck.service.store import Store

    if path.exists() and not path.is_dir():
        raise UsageError(f"--data {path}: not a directory")
    try:
        path.mkdir(parents=True, exist_ok=True)
        probe = path / f".write-test-{os.getpid()}"
        probe.write_bytes(b"")
        probe.unlink()
    except OSError as exc:
        raise UsageError(f"--data {path}: cannot be written ({exc.strerror or exc})") from None
    try:
        Store(path).close()
    except (sqlite3.Error, OSError) as exc:
        raise UsageError(f"--data {path}: its database cannot be opened ({exc})") from None
    return path.resolve()


def listening_socket(host: str, port: int) -> socket.socket:
    """A socket bound to ``host:port`` (port 0: any free one); UsageError when it cannot be."""
    try:
        infos = socket.getaddrinfo(
            host.strip("[]"), port, type=socket.SOCK_STREAM, flags=socket.AI_PASSIVE
        )
    except socket.gaierror as exc:
        raise UsageError(f"--host {host}: {exc.strerror or exc}") from None
    family, kind, proto, _, address = infos[0]
    sock = socket.socket(family, kind, proto)
    sock.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1)
    try:
        sock.bind(address)
    except OSError as exc:
        sock.close()
        raise UsageError(f"cannot listen on {host}:{port}: {exc.strerror or exc}") from None
    sock.set_inheritable(True)
    return sock


@click.group()
def token() -> None:
    """Make, list and revoke the service's access tokens."""


def _store(data_dir: str):
    from ifccheck.service.store import Store

    return Store(usable_data_dir(Path(data_dir)))


@token.command("create")
@click.argument("name")
@_data_option
def token_create(name: str, data_dir: str) -> None:
    """Make a token named NAME; it is printed once, on the last line."""
    from ifccheck.service.auth import create_token

    store = _store(data_dir)
    try:
        value = create_token(store, name)
    except ValueError as exc:
        raise UsageError(str(exc)) from None
    finally:
        store.close()
    click.echo(f"token {name!r} made; only its hash is stored, so copy it now:")
    click.echo(value)


@token.command("revoke")
@click.argument("name")
@_data_option
def token_revoke(name: str, data_dir: str) -> None:
    """Revoke the token named NAME; requests with it are refused from now on."""
    store = _store(data_dir)
    try:
        n = store.revoke_tokens(name)
    finally:
        store.close()
    if not n:
        raise UsageError(f"no active token named {name!r}")
    click.echo(f"token {name!r} revoked")


@token.command("list")
@_data_option
def token_list(data_dir: str) -> None:
    """List the tokens (names and dates; the tokens themselves are not stored)."""
    store = _store(data_dir)
    try:
        rows = store.tokens()
    finally:
        store.close()
    for r in rows:
        state = f"revoked {r.revoked_at}" if r.revoked_at else "active"
        click.echo(f"{r.name}\t{r.id}\tmade {r.created_at}\t{state}")
