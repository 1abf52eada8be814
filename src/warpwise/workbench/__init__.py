"""The workbench: the whole job of warpwise on a local web page (``warpwise workbench``).

:mod:`.app` is the ASGI application, :mod:`.server` starts it under uvicorn; the work runs in
worker processes (:mod:`.jobs`) through the same functions as the command line (:mod:`.tasks`,
:mod:`.choices`). Nothing here computes a section property or reads a file itself.
"""
