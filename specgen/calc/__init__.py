"""Pure relations on SI floats, one topic a module, and resolve.py which walks the model."""
