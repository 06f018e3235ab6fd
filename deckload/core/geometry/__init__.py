"""Hull and compartment geometry → hydrostatic, cross-curve and tank tables by direct calculation.

Pure numpy.  The pipeline: ``spec`` (the validated geometry model) → ``hull`` (section
polygons) → ``sections``/``body`` (clipping and integration) → ``hydrostatics_calc``,
``cross_curves``, ``tanks``, ``transfer`` → ``builder.build_tables`` (everything at once).
"""
