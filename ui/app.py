"""ullage in the browser: the entry script that lays out the pages.

Run it with ``ullage app`` (or ``python ui/launch.py`` in a checkout). Each page is
also a script of its own under ``screens/`` beside this file. Installed, this folder
is the package ``ullage_ui``.
"""

from pathlib import Path

import streamlit as st

_HERE = Path(__file__).resolve().parent

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
