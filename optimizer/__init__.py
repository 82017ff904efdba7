"""Everything above the physics, in sub-packages whose imports point one way (down):

``cli`` -> ``review`` | ``batch`` -> ``search`` -> ``run_folder`` -> ``inputs`` -> ``model``
-> (``errors``, ``atomic``, ``cautions``) -> :mod:`cablefam.physics`.

See DEVELOPERS.md for what each sub-package holds and where to add things.
"""
