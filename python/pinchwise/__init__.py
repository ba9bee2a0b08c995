"""pinchwise from Python: binary VLE fitting, consistency tests, azeotropes, minimum reflux,
liquid-liquid splits, the decanter scheme and the rating of a given column.

A thin layer over the pinchwise shared library (ctypes, standard library only). Every function
returns the dict that the matching command prints with ``--json``: the library builds that JSON
text once, for the command line and for this module alike, so keys and values are the same.

    >>> import pinchwise
    >>> f = pinchwise.fit("datasets/demo_acetone_water.csv", "nrtl")
    >>> r = pinchwise.reflux(f, "101.325kPa", xd=0.95, xb=0.02, zf=0.10)
    >>> r["r_min"], r["pinch"]["kind"]

Quantities are strings with their unit ("101.325kPa", "1atm", "350K", "50C"); compositions are
mole fractions of the first component named in the dataset. Failures raise
:class:`PinchwiseError`, whose message names the file, the line and what is wrong.

The shared library is found through the environment variable ``PINCHWISE_LIBRARY`` (a path to
``libpinchwise.so``), else in ``build/`` of the source tree this package sits in, else in the
library folder of the installation this package was installed into, else on the system's
library path.

Results are screening estimates from correlations fitted to limited laboratory data: verify any
design with rigorous simulation and pilot data, follow local codes, and have it reviewed by a
qualified (licensed where required) engineer.
"""

import ctypes
import ctypes.util
import glob
import json
import math
import os
import tempfile
import threading

__all__ = ["fit", "check", "azeotrope", "reflux", "screen", "lle", "decanter", "rate", "Fit",
           "PinchwiseError", "library_path", "version"]

_PATH_MAX = 512        # PW_PATH_MAX of pinchwise/status.h
_ERROR_MSG_MAX = 640   # PW_ERROR_MSG_MAX


class _Error(ctypes.Structure):
    """pw_error of pinchwise/status.h (its size is checked against the library's)."""
    _fields_ = [("status", ctypes.c_int), ("file", ctypes.c_char * _PATH_MAX),
                ("line", ctypes.c_long), ("msg", ctypes.c_char * _ERROR_MSG_MAX)]


class PinchwiseError(Exception):
    """A failure reported by the library.

    ``str(e)`` is the library's one-line message ``file:line: what is wrong``; the parts are
    ``e.file`` (or None), ``e.line`` (0 when there is none), ``e.message`` and ``e.status``
    (the library's status name, e.g. ``"malformed input"``)."""

    def __init__(self, text, status=None, file=None, line=0, message=None):
        super().__init__(text)
        self.status = status
        self.file = file
        self.line = line
        self.message = message if message is not None else text


class Fit(dict):
    """The dict :func:`fit` returns (the keys of ``pinchwise fit --json``).

    It also carries the whole fit file's text in :attr:`fit_file_text` (not a key), so it can be
    passed to :func:`reflux`, :func:`azeotrope`, :func:`screen`, :func:`lle`, :func:`decanter`
    and :func:`rate` even when no fit file was written. :meth:`save` writes that fit file."""

    def __init__(self, doc, fit_file_text):
        super().__init__(doc)
        self.fit_file_text = fit_file_text

    def save(self, path, force=False):
        """Writes the fit file to path, atomically (a temporary file beside it, then moved into
        place). An existing file is replaced only with force=True; otherwise PinchwiseError."""
        folder = os.path.dirname(os.path.abspath(path))
        fd, tmp = tempfile.mkstemp(prefix=".pinchwise-", dir=folder)
        try:
            with os.fdopen(fd, "w", encoding="utf-8") as f:
                f.write(self.fit_file_text.rstrip("\n") + "\n")
                f.flush()
                os.fsync(f.fileno())
            if force:
                os.replace(tmp, path)
            else:
                try:
                    os.link(tmp, path)  # fails when path exists: never replaces a file
                except FileExistsError:
                    raise PinchwiseError("%s: fit file exists (pass force=True to replace it)"
                                         % path, status="output file exists", file=str(path))
        finally:
            if os.path.exists(tmp):
                os.unlink(tmp)


_lock = threading.Lock()
_lib = None
_lib_path = None


def _candidates():
    env = os.environ.get("PINCHWISE_LIBRARY")
    if env:
        yield env
        return
    here = os.path.dirname(os.path.abspath(__file__))
    # source tree: python/pinchwise/ -> build/
    yield from sorted(glob.glob(os.path.join(here, "..", "..", "build", "libpinchwise.so*")))
    # installed: <libdir>/python3/dist-packages/pinchwise/ -> <libdir>/
    yield from sorted(glob.glob(os.path.join(here, "..", "..", "..", "libpinchwise.so*")))
    found = ctypes.util.find_library("pinchwise")
    if found:
        yield found


def _load():
    global _lib, _lib_path
    with _lock:
        if _lib is not None:
            return _lib
        tried = []
        for cand in _candidates():
            try:
                lib = ctypes.CDLL(cand)
            except OSError as e:
                tried.append("%s (%s)" % (cand, e))
                continue
            _declare(lib)
            if lib.pw_api_error_size() != ctypes.sizeof(_Error):
                raise PinchwiseError("%s: this module does not match the library (error record "
                                     "size %d, expected %d)"
                                     % (cand, lib.pw_api_error_size(), ctypes.sizeof(_Error)))
            lib.pw_api_init()
            _lib, _lib_path = lib, os.path.realpath(cand) if os.path.exists(cand) else cand
            return lib
        raise PinchwiseError("the pinchwise shared library was not found (build it with the "
                             "README's commands, or set PINCHWISE_LIBRARY to libpinchwise.so)"
                             + ("; tried: " + "; ".join(tried) if tried else ""))


def _declare(lib):
    c_str, c_int, c_double, c_void_p = ctypes.c_char_p, ctypes.c_int, ctypes.c_double, ctypes.c_void_p
    c_long = ctypes.c_long
    out = ctypes.POINTER(c_void_p)
    err = ctypes.POINTER(_Error)
    sigs = {
        "pw_api_init": (None, []),
        "pw_api_version": (c_str, []),
        "pw_api_free": (None, [c_void_p]),
        "pw_api_error_size": (ctypes.c_size_t, []),
        "pw_strerror": (c_str, [c_int]),
        "pw_model_names": (c_str, [ctypes.c_char_p, ctypes.c_size_t]),
        "pw_error_format": (c_str, [err, ctypes.c_char_p, ctypes.c_size_t]),
        "pw_api_fit": (c_int, [c_str, c_str, c_str, c_str, c_int, out, out, err]),
        "pw_api_fit_lle": (c_int, [c_str, c_str, c_str, c_str, c_str, c_int, out, out, err]),
        "pw_api_check": (c_int, [c_str, c_str, c_int, out, err]),
        "pw_api_azeotrope": (c_int, [c_str, c_str, c_str, c_str, c_str, c_str, c_int, c_long,
                                     c_long, out, err]),
        "pw_api_reflux": (c_int, [c_str, c_str, c_str, c_str, c_str, c_double, c_double,
                                  c_double, c_double, c_int, c_long, c_long, out, err]),
        "pw_api_reflux_ex": (c_int, [c_str, c_str, c_str, c_str, c_str, c_double, c_double,
                                     c_double, c_double, c_int, c_long, c_long, c_int, out, err]),
        "pw_api_screen": (c_int, [c_str, c_str, c_str, c_str, c_str, c_double, c_double,
                                  c_double, out, err]),
        "pw_api_lle": (c_int, [c_str, c_str, c_str, c_str, c_str, c_str, c_str, c_long, out,
                               err]),
        "pw_api_decanter": (c_int, [c_str, c_str, c_str, c_str, c_str, c_double, c_double,
                                    c_double, c_double, out, err]),
        "pw_api_decanter_ex": (c_int, [c_str, c_str, c_str, c_str, c_str, c_double, c_double,
                                       c_double, c_double, c_int, c_long, c_long, out, err]),
        "pw_api_decanter_ex2": (c_int, [c_str, c_str, c_str, c_str, c_str, c_double, c_double,
                                        c_double, c_double, c_int, c_long, c_long, c_str, out,
                                        err]),
        "pw_api_rate": (c_int, [c_str, c_str, c_str, c_str, c_str, c_long, c_long, c_double,
                                c_double, c_double, c_double, c_int, out, err]),
    }
    for name, (res, args) in sigs.items():
        fn = getattr(lib, name)
        fn.restype = res
        fn.argtypes = args


def library_path():
    """The path of the shared library in use (loading it if needed)."""
    _load()
    return _lib_path


def version():
    """The library's version string."""
    return _load().pw_api_version().decode()


def models():
    """The activity models the library offers, in its table order (the names ``fit`` takes)."""
    buf = ctypes.create_string_buffer(512)
    _load().pw_model_names(buf, len(buf))
    return [m.strip() for m in buf.value.decode().split(",") if m.strip()]


def _b(value):
    """A path or text argument as bytes (None stays None)."""
    if value is None:
        return None
    if isinstance(value, bytes):
        b = value
    elif isinstance(value, os.PathLike):
        b = os.fsencode(value)
    else:
        b = str(value).encode("utf-8")
    if b"\0" in b:  # C would see only the part before it
        raise PinchwiseError("%r: contains a NUL character" % (value,), status="invalid argument")
    return b


def _raise(lib, status, e):
    buf = ctypes.create_string_buffer(_PATH_MAX + _ERROR_MSG_MAX + 32)
    text = lib.pw_error_format(ctypes.byref(e), buf, len(buf)).decode("utf-8", "replace")
    file = e.file.decode("utf-8", "replace") or None
    raise PinchwiseError(text or lib.pw_strerror(status).decode(),
                         status=lib.pw_strerror(status).decode(), file=file, line=e.line,
                         message=e.msg.decode("utf-8", "replace"))


def _take(lib, ptr):
    """The text at ptr (freed by the library), or None."""
    if not ptr.value:
        return None
    try:
        return ctypes.string_at(ptr.value).decode("utf-8")
    finally:
        lib.pw_api_free(ptr)


def _call(fn_name, *args, extra_out=False):
    lib = _load()
    e = _Error()
    doc = ctypes.c_void_p()
    more = ctypes.c_void_p()
    outs = (ctypes.byref(doc), ctypes.byref(more)) if extra_out else (ctypes.byref(doc),)
    status = getattr(lib, fn_name)(*args, *outs, ctypes.byref(e))
    text, other = _take(lib, doc), _take(lib, more)
    if status != 0:
        _raise(lib, status, e)
    d = json.loads(text)
    return (d, other) if extra_out else d


def _fraction(name, v):
    try:
        v = float(v)
    except (TypeError, ValueError):
        raise PinchwiseError("%s %r: not a number" % (name, v), status="invalid argument")
    if not math.isfinite(v):
        raise PinchwiseError("%s %r: not a finite number" % (name, v), status="invalid argument")
    return v


def _count(name, v):
    """samples or seed: a whole number >= 0, or None for the default (passed as -1)."""
    if v is None:
        return -1
    if isinstance(v, bool) or not isinstance(v, int) or v < 0:
        raise PinchwiseError("%s %r: expected a whole number >= 0" % (name, v),
                             status="invalid argument")
    return v


def _whole(name, v):
    """A whole number (an int, or a float without fraction) for a C long; the library checks
    its range."""
    if isinstance(v, float) and math.isfinite(v) and v.is_integer():
        v = int(v)
    if isinstance(v, bool) or not isinstance(v, int):
        raise PinchwiseError("%s %r: expected a whole number" % (name, v),
                             status="invalid argument")
    if not -2**31 <= v < 2**31:
        raise PinchwiseError("%s %r: out of range" % (name, v), status="invalid argument")
    return v


def _scan(scan):
    """(from, to, n) for the library from "FROM:TO:N" or a (from, to, n) sequence; None: no
    scan."""
    if scan is None:
        return None, None, 0
    if isinstance(scan, (str, bytes)):
        text = scan.decode() if isinstance(scan, bytes) else scan
        parts = text.split(":")
        if len(parts) != 3:
            raise PinchwiseError("scan %r: expected FROM:TO:N, e.g. \"20C:120C:11\"" % (text,),
                                 status="invalid argument")
        try:
            n = int(parts[2])
        except ValueError:
            raise PinchwiseError("scan %r: N must be a whole number from 2 to 1000" % (text,),
                                 status="invalid argument")
        return _b(parts[0]), _b(parts[1]), n if -2**31 <= n < 2**31 else -1
    try:
        t_from, t_to, n = scan
    except (TypeError, ValueError):
        raise PinchwiseError("scan %r: expected \"FROM:TO:N\" or (FROM, TO, N)" % (scan,),
                             status="invalid argument")
    return _b(t_from), _b(t_to), _whole("scan N", n)


def _fit_source(fit):
    """(fit_path, fit_text, name) for the library from a path, a Fit or a fit file's dict."""
    if isinstance(fit, (str, bytes, os.PathLike)):
        return _b(fit), None, None
    if isinstance(fit, Fit):
        name = fit.get("fit_file") or "fit"
        return None, _b(fit.fit_file_text), _b(name)
    if isinstance(fit, dict):
        if "format" in fit and "data" in fit:  # a whole fit file, e.g. json.load(open(FIT))
            return None, _b(json.dumps(fit)), b"fit"
        if fit.get("fit_file"):  # a `fit --json` document: read the file it names
            return _b(fit["fit_file"]), None, None
    raise PinchwiseError("fit must be a fit-file path, the dict fit() returned, or a fit file's "
                         "contents", status="invalid argument")


def fit(path, model, components=None, out=None, force=False, lle=None):
    """Fits an activity model to a measured binary VLE file; like ``pinchwise fit --json``.

    path: the dataset (CSV with ``# components:`` and ``# pressure:`` or ``# temperature:``).
    model: one of ``models()`` (``"margules"``, ``"vanlaar"``, ``"wilson"``, ``"nrtl"``,
    ``"uniquac"``), any case.
    components: an extra component file whose rows take precedence over the shipped library.
    out: where to write the fit file (atomically; an existing file is replaced only with
    force=True). Without out nothing is written and the result's ``"fit_file"`` is None.
    lle: a tie-line file (``T[UNIT]``, ``x1_I``, ``x1_II``, or ``w1_I``, ``w1_II`` as mass
    fractions) fitted together with the VLE data,
    as ``pinchwise fit --lle``; the model must be one that can split.

    Returns a :class:`Fit` (a dict with the command's keys: model, converged, components,
    parameters, stderr, ln_gamma_inf, T_ref_K, aad_y, aad_T_K, aad_P_kPa, statistics, ...)."""
    doc, text = _call("pw_api_fit_lle", _b(path), _b(model), _b(components), _b(lle), _b(out),
                      1 if force else 0, extra_out=True)
    return Fit(doc, text)


def check(path, components=None, strict=False):
    """Thermodynamic consistency tests of a dataset; like ``pinchwise check --json``.

    Returns a dict with ``tests`` (name, value, limit, pass, source, ...) and ``consistent``."""
    return _call("pw_api_check", _b(path), _b(components), 1 if strict else 0)


def azeotrope(fit, pressure=None, temperature=None, components=None, uncertainty=False,
              samples=None, seed=None):
    """Azeotropes of a fitted model; like ``pinchwise azeotrope --json``.

    fit: a fit-file path or the dict :func:`fit` returned. Give a pressure (e.g. "1atm") or a
    temperature (e.g. "50C"); with neither, the condition of the fit's own data.
    components: a component file whose vapor pressures replace the fit file's.
    uncertainty, samples, seed: as ``--uncertainty --samples N --seed N`` (giving samples or
    seed switches it on): each azeotrope then has x1_ci95 and T_K_ci95 (or P_kPa_ci95) from the
    fit's parameter covariance.

    Returns a dict with ``azeotropes`` (x1, T_K, P_kPa, kind, ...)."""
    fit_path, fit_text, name = _fit_source(fit)
    return _call("pw_api_azeotrope", fit_path, fit_text, name, _b(components), _b(pressure),
                 _b(temperature), 1 if uncertainty else 0, _count("samples", samples),
                 _count("seed", seed))


def reflux(fit, pressure, xd, xb, zf, q=1.0, components=None, uncertainty=False, samples=None,
           seed=None, energy=False):
    """Minimum reflux, limiting pinch and stages of a binary column; like
    ``pinchwise reflux --json``.

    fit: a fit-file path or the dict :func:`fit` returned. pressure: with its unit
    ("101.325kPa"). xd, xb, zf: distillate, bottoms and feed mole fractions of component 1.
    q: the feed's liquid fraction (1 saturated liquid).
    uncertainty, samples, seed: as ``--uncertainty --samples N --seed N`` (giving samples or
    seed switches it on): adds r_min_ci95, feasible_probability and "uncertainty".
    energy: as ``--energy``: an energy balance on every stage (heats of vaporization and heat
    capacities from the fit file, or from components) instead of constant molal overflow;
    ``"balance"`` is then ``"energy"``, the headline numbers are the energy balance's, and every
    design row adds condenser_kJ_per_mol_feed and reboiler_kJ_per_mol_feed.

    Returns a dict with feasible, reason, r_min, pinch (kind, section, x, y), n_min, design,
    balance, ..."""
    fit_path, fit_text, name = _fit_source(fit)
    return _call("pw_api_reflux_ex", fit_path, fit_text, name, _b(components), _b(pressure),
                 _fraction("xd", xd), _fraction("xb", xb), _fraction("zf", zf),
                 _fraction("q", q), 1 if uncertainty else 0, _count("samples", samples),
                 _count("seed", seed), 1 if energy else 0)


def screen(fit, pressure, xd, xb, zf=None, components=None):
    """Quick feasibility verdict for a split; like ``pinchwise screen --json``.

    zf: the feed (default: 0.5, or the middle of (xb, xd) when 0.5 lies outside).

    Returns a dict with verdict, reasons, alpha_min, azeotropes, r_min, ..."""
    fit_path, fit_text, name = _fit_source(fit)
    return _call("pw_api_screen", fit_path, fit_text, name, _b(components), _b(pressure),
                 _fraction("xd", xd), _fraction("xb", xb),
                 float("nan") if zf is None else _fraction("zf", zf))


def lle(fit, temperature=None, scan=None, components=None):
    """The two liquid layers a fitted model predicts at a temperature; like
    ``pinchwise lle --json``.

    fit: a fit-file path or the dict :func:`fit` returned. temperature: with its unit ("25C",
    "298.15K"); None with a scan: the scan's FROM (as the command without --temperature). scan: ``"FROM:TO:N"`` (e.g. ``"20C:120C:11"``) or a tuple ``("20C", "120C", 11)``:
    also the layers at N temperatures from FROM to TO (N from 2 to 1000) and the critical
    solution temperatures between them.

    Returns a dict with split, x1 ([x_I, x_II] with x_I < x_II, or None), T_K, components, model,
    model_can_split, activities, min_tangent_plane_distance, min_d2G_dx2 and, with scan, "scan"
    (T_K, split, x1 at each temperature) and "critical" (T_K, x1, kind "upper" or "lower").
    Layers predicted from vapor-liquid data can be far from measured solubilities: check them
    against measured tie lines before sizing a decanter."""
    fit_path, fit_text, name = _fit_source(fit)
    t_from, t_to, n = _scan(scan)
    if temperature is None and scan is None:
        raise PinchwiseError("a temperature (or a scan) is required", status="invalid argument")
    return _call("pw_api_lle", fit_path, fit_text, name, _b(components),
                 _b(temperature) if temperature is not None else t_from, t_from, t_to, n)


def decanter(fit, pressure, zf, x1_rich, x1_lean, q=1.0, components=None, uncertainty=False,
             samples=None, seed=None, decanter_temperature=None):
    """The decanter and two stripping columns of a partly miscible binary with a heterogeneous
    azeotrope; like ``pinchwise decanter --json``.

    The fresh feed (zf, liquid fraction q) and both condensed overheads enter one decanter at
    the three-phase temperature (or, cooled, at decanter_temperature, a temperature with its unit
    such as "30C", as ``--decanter-temperature``: its layers there, each reheated to its bubble
    point before it tops its column); its layer rich in component 1 tops a stripping column whose
    bottoms has x1 = x1_rich, the other layer tops a second one with bottoms x1 = x1_lean. zf
    lies strictly between 0 and 1; q changes the condenser duty only (the feed enters the
    decanter). An impossible specification returns ``"feasible": False`` with a ``"reason"``.
    uncertainty, samples, seed: as ``--uncertainty --samples N --seed N`` (giving samples or
    seed switches it on): when the scheme is feasible, each column adds boilup_min_ci95 and the
    dict adds "uncertainty" (T_K, vapor_x1, x1_layers, boilup_min, decanter_x1_layers (a cooled
    decanter's own layers; else x1_layers again), feasible_probability, draws, seed) from the
    fit's parameter covariance.

    Returns a dict with feasible, reason, decanter (T_K, x1_layers, vapor_x1, cooled),
    three_phase (T_K, x1_layers, vapor_x1), columns (bottoms rich in 1 first: bottoms_x1, top_x1,
    boilup_min, n_min, design rows with reboiler_kJ_per_mol_feed and reheat_kJ_per_mol_feed,
    pinch), bottoms_per_mol_feed, balance_closure, condenser_kJ_per_mol_feed and
    energy_closure_kJ_per_mol_feed (per design row: the condenser's duty and the first-law residual
    of the constant-molal-overflow flows; None without heat data, duties_note then says why), q,
    caution. For a cooled decanter, decanter.vapor_x1 is None (three_phase holds the vapor)."""
    fit_path, fit_text, name = _fit_source(fit)
    return _call("pw_api_decanter_ex2", fit_path, fit_text, name, _b(components), _b(pressure),
                 _fraction("zf", zf), _fraction("x1_rich", x1_rich),
                 _fraction("x1_lean", x1_lean), _fraction("q", q), 1 if uncertainty else 0,
                 _count("samples", samples), _count("seed", seed), _b(decanter_temperature))


def rate(fit, pressure, stages, feed_stage, reflux, zf, distillate, q=1.0, energy=False,
         components=None):
    """The products and stage profile of a given column; like ``pinchwise rate --json``.

    stages: N equilibrium stages counted from the top, the partial reboiler as stage N (the
    total condenser not counted); feed_stage: the stage K the whole feed enters; reflux: the
    reflux ratio R = L/D; zf: feed mole fraction of component 1; distillate: D, moles per mole
    of feed; q: the feed's liquid fraction. energy: as ``--energy``, an energy balance on every
    stage instead of constant molal overflow, adding the duties.

    Returns a dict with xd, xb, stages (stage, x1, y1, T_K, L, V), balance, spec,
    feed_stage_mismatch and, with energy, condenser_kJ_per_mol_feed, reboiler_kJ_per_mol_feed
    and steady_states_found."""
    fit_path, fit_text, name = _fit_source(fit)
    return _call("pw_api_rate", fit_path, fit_text, name, _b(components), _b(pressure),
                 _whole("stages", stages), _whole("feed_stage", feed_stage),
                 _fraction("reflux", reflux), _fraction("zf", zf),
                 _fraction("distillate", distillate), _fraction("q", q), 1 if energy else 0)
