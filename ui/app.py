"""ullage in the browser: the entry script that lays out the pages.

Run it with ``python ui/launch.py`` (or the ``streamlit run`` command in that
file's docstring). Each page is also a script of its own under ``ui/screens/``.
"""

import sys
from pathlib import Path

_HERE = Path(__file__).resolve().parent
if str(_HERE.parent) not in sys.path:
    sys.path.insert(0, str(_HERE.parent))

import streamlit as st  # noqa: E402

st.set_page_config(page_title="ullage: vapour hazard screening", layout="wide")

PAGES = _HERE / "screens"
navigation = st.navigation({
    "Case": [
        st.Page(PAGES / "start.py", title="Start", default=True),
    ],
    "Screening": [
        st.Page(PAGES / "tank.py", title="Tank headspace", url_path="tank"),
        st.Page(PAGES / "spill_indoors.py", title="Spill indoors", url_path="spill-indoors"),
        st.Page(PAGES / "spill_outdoors.py", title="Spill outdoors", url_path="spill-outdoors"),
        st.Page(PAGES / "inventory.py", title="Site inventory", url_path="inventory"),
        st.Page(PAGES / "compare.py", title="Two cases side by side", url_path="compare"),
    ],
    "Settings": [
        st.Page(PAGES / "limits.py", title="Limits, alarms and site", url_path="limits"),
    ],
})
navigation.run()
