"""Browser front end of ullage: Streamlit pages that gather inputs, call the core and show results."""
