"""Atomic file writes: a failed build never leaves a half-written file or
overwrites the last good one."""
from __future__ import annotations

import os
import tempfile
from contextlib import contextmanager
from pathlib import Path


@contextmanager
def atomic_stream(path: Path, mode: int = 0o644, binary: bool = False):
    """Stream into a temporary file in the same folder; fsync and rename over ``path`` when the block ends.

    If the block raises (or the process is interrupted), the temporary file is removed and ``path`` keeps
    its old bytes."""
    path = Path(path)
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    try:
        with os.fdopen(fd, "wb" if binary else "w", **({} if binary else {"encoding": "utf-8", "newline": ""})) as fh:
            yield fh
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, mode)
        os.replace(tmp, path)
    except BaseException:
        discard_staged([tmp])
        raise


def write_atomic(path: Path, data: bytes, mode: int = 0o644) -> None:
    """Write to a temporary file in the same folder, fsync, then rename over ``path``."""
    path = Path(path)
    with atomic_stream(path, mode, binary=True) as fh:
        fh.write(data)
    _fsync_dir(path.parent)


def write_atomic_files(files, mode: int = 0o644, sync_folders: bool = True) -> None:
    """Several ``(path, bytes)`` files, each written as ``write_atomic`` writes one (temporary file, fsync,
    rename), and each folder holding them synced once at the end rather than once per file (a member of a
    schedule is two or three files: one folder sync where there were as many as files).

    ``sync_folders=False`` leaves the folder sync to a caller that syncs the folder itself once it has
    written everything that goes there (``sync_folder``): each file is still replaced atomically, whole.
    """
    folders: list[Path] = []
    try:
        for path, data in files:
            path = Path(path)
            with atomic_stream(path, mode, binary=True) as fh:
                fh.write(data)
            if path.parent not in folders:
                folders.append(path.parent)
    finally:  # the renames already made are made durable even when a later file fails
        for folder in folders if sync_folders else ():
            _fsync_dir(folder)


def sync_folder(folder: Path) -> None:
    """Make the renames made in ``folder`` durable (fsync the folder)."""
    _fsync_dir(Path(folder))


# ---------------------------------------------------------------- a file written in two halves
#
# ``write_atomic`` split in two for a writer that hands the second half to another process: ``stage_file``
# writes the bytes to a temporary file beside the target (nothing at the target changes), ``commit_staged``
# fsyncs it, sets its mode and renames it over the target, whole. A schedule's pool workers stage their
# members' files and the calling process commits them, so the fsyncs come from one process, one after
# another, instead of from every worker at once (where each waited on the others' journal commits).

STAGED_SUFFIX = ".staged"


def stage_file(path: Path, data: bytes) -> Path:
    """The bytes in a new temporary file beside ``path`` (not yet synced); its path. ``path`` is untouched."""
    path = Path(path)
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=STAGED_SUFFIX, dir=path.parent)
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
    except BaseException:
        discard_staged([tmp])
        raise
    return Path(tmp)


def commit_staged(tmp: Path, path: Path, mode: int = 0o644) -> None:
    """Finish a staged file as ``write_atomic`` finishes one: fsync, set the mode, rename over ``path``.
    On failure the staged file is removed and ``path`` keeps its old bytes."""
    try:
        fd = os.open(tmp, os.O_RDWR)
        try:
            os.fsync(fd)
        finally:
            os.close(fd)
        os.chmod(tmp, mode)
        os.replace(tmp, path)
    except BaseException:
        discard_staged([tmp])
        raise


def discard_staged(tmps) -> None:
    """Remove these temporary files (those already gone are no error)."""
    for tmp in tmps:
        try:
            os.unlink(tmp)
        except FileNotFoundError:
            pass


def sweep_staged(folder: Path, older_than: float = 0.0) -> None:
    """Remove the staged files left in ``folder`` (by a build that stopped before committing them), those
    older than ``older_than`` seconds."""
    import time

    now = time.time()
    for p in Path(folder).glob(f".*{STAGED_SUFFIX}"):
        try:
            if now - p.stat().st_mtime >= older_than:
                p.unlink()
        except FileNotFoundError:
            pass


# ---------------------------------------------------------------- a package: several files as one unit
#
# out/<stem>.html, .pdf, .json are symbolic links into out/.calcsheet/<stem>/current/, and
# ``current`` is itself a link to the folder of one build (out/.calcsheet/<stem>/build-XXXX/).
# A build writes every file into a new build folder, then swaps ``current`` with one rename:
# a reader sees the whole old package or the whole new one, never a mixture, and a failure
# (or a kill) before the rename leaves the old one byte-identical. docs/limits.md#the-package.

STORE = ".calcsheet"
STALE_SECONDS = 600  # a build folder left by a killed build is removed by a build this much later


def _fsync_dir(folder: Path) -> None:
    try:
        dfd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(dfd)
    except OSError:
        pass
    finally:
        os.close(dfd)


def _remove_tree(path: Path) -> None:
    import shutil

    if path.is_symlink() or path.is_file():
        path.unlink(missing_ok=True)
    elif path.exists():
        shutil.rmtree(path, ignore_errors=True)


def _swap_link(link: Path, target: str) -> None:
    """Point ``link`` at ``target`` with one rename (a new link beside it, then ``os.replace``)."""
    tmp = link.with_name(f".{link.name}.{os.getpid()}.{os.urandom(4).hex()}.tmp")
    try:
        os.symlink(target, tmp)
        os.replace(tmp, link)
    except BaseException:
        tmp.unlink(missing_ok=True)
        raise


def _sweep(store: Path, keep: str | None) -> None:
    """Build folders and link temps left by a killed build, once they are clearly not in progress."""
    import time

    if not store.is_dir():
        return
    now = time.time()
    for p in store.iterdir():
        if p.name in ("current", keep):
            continue
        if p.name.startswith(("build-", ".current.")):
            try:
                if now - p.lstat().st_mtime > STALE_SECONDS:
                    _remove_tree(p)
            except OSError:
                pass


def publish_package(out_dir: Path, stem: str, files: dict[str, bytes], mode: int = 0o644) -> list[Path]:
    """Write ``files`` ({name: bytes}) as one package in ``out_dir``; returns the paths users open.

    Every file is written and fsynced in a fresh build folder first; then the ``current`` link is swapped
    by one ``os.replace``. Only after that are links for new file names added and the previous build
    folder removed. A failure before the swap removes the new build folder and leaves the old package as
    it was, byte for byte; ``out/<stem>.<ext>`` keep their paths.
    """
    import tempfile

    out_dir = Path(out_dir)
    store = out_dir / STORE / stem
    store.mkdir(parents=True, exist_ok=True)
    current = store / "current"
    old = os.readlink(current) if current.is_symlink() else None
    _sweep(store, old)
    build = Path(tempfile.mkdtemp(prefix="build-", dir=store))
    try:
        for name, data in files.items():
            path = build / name
            with os.fdopen(os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600), "wb") as fh:
                fh.write(data)
                fh.flush()
                os.fsync(fh.fileno())
            os.chmod(path, mode)
        os.chmod(build, 0o755)
        _fsync_dir(build)
        # the links users open point through ``current``: once made they never change, so the swap is
        # the only moment the package changes. A folder in the way is found before anything changes.
        rel = Path(STORE) / stem / "current"
        for name in files:
            link = out_dir / name
            if not link.is_symlink() or os.readlink(link) != str(rel / name):
                if link.exists() and not link.is_symlink() and link.is_dir():
                    raise IsADirectoryError(21, f"a folder is in the way of {link}")
        _swap_link(current, build.name)  # THE switch: old package -> new package
        _fsync_dir(store)
    except BaseException:
        _remove_tree(build)
        raise
    for name in files:  # a file name new to this package (or a file of the old layout) becomes a link
        link = out_dir / name
        if not link.is_symlink() or os.readlink(link) != str(rel / name):
            _swap_link(link, str(rel / name))
    for link in out_dir.glob(f"{stem}.*"):  # a format the old package had and this one has not
        if link.is_symlink() and os.readlink(link).startswith(str(rel) + os.sep) and not link.exists():
            link.unlink(missing_ok=True)
    _fsync_dir(out_dir)
    if old and old != build.name:
        _remove_tree(store / old)
    return [out_dir / name for name in files]
