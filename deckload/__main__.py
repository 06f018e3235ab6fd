from deckload.cli import main

raise SystemExit(main())
