"""Reports: the quantity list, the text table, CSV and JSON files."""
