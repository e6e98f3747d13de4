"""A private, headless LibreOffice for tests, the main job and the seam benchmark.

Run with /usr/bin/python3 (Debian's python3-uno provides the `uno` module).

Office(profile) starts soffice on a named pipe with its own user profile (a throwaway folder, so
the user's own profile and the LibreOffice installation are never touched), and installs the
.oxt into that profile through the office's ExtensionManager. That route works for an ordinary
user and for root alike: `unopkg` refuses user installs as root, and `unopkg --shared` would
change the system-wide installation. After installing, the office is restarted so that Calc
reads the add-in's configuration on a clean start.
"""

import os
import shutil
import signal
import subprocess
import tempfile
import time
import uuid

import uno
import unohelper
from com.sun.star.beans import PropertyValue
from com.sun.star.connection import NoConnectException
from com.sun.star.task import XInteractionApprove, XInteractionHandler
from com.sun.star.ucb import XCommandEnvironment, XProgressHandler

SOFFICE = os.environ.get("QUADRAT_SOFFICE", "/usr/lib/libreoffice/program/soffice")


def file_url(path):
    return uno.systemPathToFileUrl(os.path.abspath(path))


def props(**values):
    out = []
    for name, value in values.items():
        p = PropertyValue()
        p.Name = name
        p.Value = value
        out.append(p)
    return tuple(out)


class _AcceptEverything(unohelper.Base, XCommandEnvironment, XInteractionHandler, XProgressHandler):
    """Installs without questions: approves whatever the office asks (replacing an older copy)."""

    def getInteractionHandler(self):
        return self

    def getProgressHandler(self):
        return self

    def handle(self, request):
        for continuation in request.getContinuations():
            if continuation.queryInterface(uno.getTypeByName("com.sun.star.task.XInteractionApprove")):
                continuation.select()
                return

    def push(self, status):
        pass

    def update(self, status):
        pass

    def pop(self):
        pass


class Office:
    """One headless soffice with a private profile. Use as a context manager."""

    def __init__(self, profile=None, keep_profile=False):
        self._own_profile = profile is None
        self.profile = profile or tempfile.mkdtemp(prefix="quadrat-office-")
        self.keep_profile = keep_profile
        self.process = None
        self.context = None
        self.desktop = None

    # --- process -------------------------------------------------------------------------
    def start(self, timeout=90):
        self.pipe = "quadrat-" + uuid.uuid4().hex[:12]
        command = [
            SOFFICE, "--headless", "--invisible", "--nologo", "--norestore", "--nodefault",
            "--nolockcheck", "--nofirststartwizard",
            "-env:UserInstallation=" + file_url(self.profile),
            "--accept=pipe,name=%s;urp;StarOffice.ComponentContext" % self.pipe,
        ]
        # A session of its own, so that the office (oosplash → soffice.bin) can be ended by its
        # process group id if it does not terminate when asked.
        self.process = subprocess.Popen(command, stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL,
                                        stderr=subprocess.DEVNULL, start_new_session=True)
        local = uno.getComponentContext()
        resolver = local.ServiceManager.createInstanceWithContext("com.sun.star.bridge.UnoUrlResolver", local)
        deadline = time.time() + timeout
        while True:
            try:
                self.context = resolver.resolve(
                    "uno:pipe,name=%s;urp;StarOffice.ComponentContext" % self.pipe)
                break
            except NoConnectException:
                if self.process.poll() is not None:
                    raise RuntimeError("soffice exited with code %s before accepting" % self.process.returncode)
                if time.time() > deadline:
                    self.stop()
                    raise RuntimeError("soffice did not accept a connection within %d s" % timeout)
                time.sleep(0.25)
        self.desktop = self.context.ServiceManager.createInstanceWithContext(
            "com.sun.star.frame.Desktop", self.context)
        return self

    def alive(self):
        """True when the office process runs and still answers over the bridge."""
        if self.process is None or self.process.poll() is not None:
            return False
        try:
            self.desktop.getComponents()
            return True
        except Exception:
            return False

    def stop(self, timeout=30):
        if self.process is None:
            return
        try:
            if self.desktop is not None:
                self.desktop.terminate()
        except Exception:
            pass  # the bridge closes while the office goes down
        try:
            self.process.wait(timeout=timeout)
        except subprocess.TimeoutExpired:
            os.killpg(self.process.pid, signal.SIGKILL)
            self.process.wait()
        self.process = None
        self.desktop = None
        self.context = None

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.stop()
        if self._own_profile and not self.keep_profile:
            shutil.rmtree(self.profile, ignore_errors=True)
        return False

    # --- extension -----------------------------------------------------------------------
    def install(self, oxt):
        """Installs the .oxt into this private profile, then restarts the office."""
        if self.process is None:
            self.start()
        manager = self.context.getValueByName("/singletons/com.sun.star.deployment.ExtensionManager")
        manager.addExtension(file_url(oxt), (), "user", manager.createAbortChannel(), _AcceptEverything())
        self.stop()
        self.start()
        return self

    # --- documents -----------------------------------------------------------------------
    def load(self, path):
        return self.desktop.loadComponentFromURL(file_url(path), "_blank", 0, props(Hidden=True))

    def new_calc(self):
        return self.desktop.loadComponentFromURL("private:factory/scalc", "_blank", 0, props(Hidden=True))
