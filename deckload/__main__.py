from deckload.cli.main import main

raise SystemExit(main())
